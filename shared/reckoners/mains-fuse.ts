/**
 * Mains fuse: transformer VA → primary current → next standard rating, fuse type, and the switch-on
 * surge: worked from the circuit (or taken from a switch-on surge block) as an I²t against the fuse's
 * pre-arcing I²t where its inputs are known, else the rule of thumb against the IEC 60127-2 time-lag gates.
 */
import { formatNumber, formatQuantity } from '../units/format';
import {
  FUSE_SERIES,
  nextFuseRating,
  QUICK_ACTING_10X_MAX,
  QUICK_ACTING_SOURCE,
  TIME_LAG_GATES,
  TIME_LAG_GATES_SOURCE,
  type FuseGate,
} from '../standards/fuses';
import { defineInputs, num, optionalQuantity, quantity, rows, select, text, type InputOf } from './fields';
import { ReckonerInputError } from './errors';
import { compact, LOCAL_CODES } from './cautions';
import { b, n, q, s, SRC } from './outputs';
import type { Caution, ReckonerDefinition, ReckonerResult } from './types';

const shape = {
  load: select({
    label: 'Load given as',
    options: [
      { value: 'windings', label: 'Secondary windings (volts × amps)' },
      { value: 'va', label: 'One VA figure' },
    ],
    default: 'windings',
  }),
  windings: rows(
    {
      label: text({ label: 'Winding' }),
      volts: quantity('V rms', {
        label: 'Winding voltage',
        min: 1e-3,
        max: 5000,
        plausible: { min: 1, max: 1500 },
      }),
      amps: quantity('A rms', {
        label: 'Winding current (AC rms)',
        min: 1e-6,
        max: 100,
        plausible: { min: 5e-3, max: 20 },
        help: 'The winding’s AC rms current. A rectified winding carries more than its DC load: about 1.0 × Idc for a bridge with choke input, 0.707 × Idc per half of a centre-tap; capacitor input more (see the loaded B+ reckoner).',
      }),
    },
    { label: 'Secondary windings', minRows: 0, maxRows: 20 },
  ),
  va: optionalQuantity('VA', {
    label: 'Transformer load',
    min: 1e-3,
    max: 5000,
    plausible: { min: 1, max: 2000 },
  }),
  mainsVoltage: quantity('V rms', {
    label: 'Mains voltage',
    default: 230,
    min: 50,
    max: 300,
    plausible: { min: 90, max: 260 },
    follows: 'mainsNominal',
    part: 'mains-nominal',
    help: 'The fuse is sized at the nominal mains the transformer is rated for.',
  }),
  efficiency: quantity('%', {
    label: 'Transformer efficiency',
    default: 85,
    min: 30,
    max: 100,
    plausible: { min: 60, max: 98 },
    part: 'transformer-efficiency',
    help: '80–90 % is usual for small mains transformers (common practice).',
  }),
  margin: num({
    label: 'Margin factor',
    default: 1.25,
    min: 1,
    max: 3,
    help: 'Required fuse current = primary current × this factor. 1.0–2.0 is seen in practice.',
  }),
  series: select({
    label: 'Fuse series',
    options: [
      { value: 'iec', label: FUSE_SERIES.iec.label },
      { value: 'north-american', label: FUSE_SERIES['north-american'].label },
    ],
    default: 'iec',
  }),
  fuseType: select({
    label: 'Fuse type',
    options: [
      { value: 'T', label: 'Time-delay (T, slow-blow)' },
      { value: 'F', label: 'Quick-acting (F)' },
    ],
    default: 'T',
    help: 'A transformer input draws a switch-on surge many times its running current: a time-delay fuse rides through it.',
  }),
  surgeI2t: optionalQuantity('A²s', {
    label: 'Switch-on surge I²t at the fuse',
    min: 1e-9,
    max: 1e6,
    plausible: { min: 1e-4, max: 1e4 },
    help: 'Refer to a switch-on surge block’s “Surge I²t in the fuse”; or give the rectified winding, source resistance and reservoir below.',
  }),
  surgeWindingVoltage: optionalQuantity('V rms', {
    label: 'Rectified winding voltage (for the surge)',
    min: 1e-3,
    max: 3000,
    plausible: { min: 2, max: 1500 },
    help: 'The winding feeding the reservoir (capacitor input; with a choke first the choke holds the surge down); one half of a centre-tapped winding.',
  }),
  surgeSourceResistance: optionalQuantity('Ω', {
    label: 'Source resistance at that winding',
    min: 1e-3,
    max: 10_000,
    plausible: { min: 0.1, max: 1000 },
    help: 'R_secondary + R_primary × (turns ratio)² + any series resistance, measured unpowered; the transformer-loading block gives it.',
  }),
  surgeReservoir: optionalQuantity('F', {
    label: 'Reservoir capacitance (for the surge)',
    min: 1e-9,
    max: 1,
    plausible: { min: 1e-6, max: 0.01 },
  }),
  fuseI2t: optionalQuantity('A²s', {
    label: 'Fuse pre-arcing I²t',
    min: 1e-6,
    max: 1e6,
    plausible: { min: 1e-3, max: 1e4 },
    help: 'From the fuse maker’s data sheet for this rating and type. Left empty, a time-lag fuse is held to the IEC 60127-2 minimum at 10 × its rating.',
  }),
  inrushMultiple: num({
    label: 'Switch-on surge (× running current)',
    default: 10,
    min: 1,
    max: 50,
    help: 'Rule of thumb, used only without the surge inputs above: about ten times the running current (common practice).',
  }),
  inrushDuration: quantity('s', {
    label: 'Switch-on surge duration',
    default: 0.2,
    min: 1e-3,
    max: 5,
    plausible: { min: 5e-3, max: 2 },
    help: 'For the rule of thumb only.',
  }),
};

export const RULE_OF_THUMB = 'rule of thumb, no inputs for the surge';

const { schema: baseSchema, fields } = defineInputs(shape);
export type MainsFuseInput = InputOf<typeof shape>;

const inputs = baseSchema.superRefine((v, ctx) => {
  if (v.load === 'windings' && v.windings.length === 0) {
    ctx.addIssue({
      code: 'custom',
      path: ['windings'],
      message: 'needs at least one winding (or choose a VA figure)',
    });
  }
  if (v.load === 'va' && v.va === undefined) {
    ctx.addIssue({
      code: 'custom',
      path: ['va'],
      message: 'is required when the load is given as a VA figure',
    });
  }
});

/** The smallest tabulated gate at or above `multiple`: the fuse is guaranteed to hold at least its `min`. */
export function gateFor(multiple: number, gates: readonly FuseGate[] = TIME_LAG_GATES): FuseGate | null {
  return gates.find((g) => g.multiple >= multiple) ?? null;
}

/** I²t of a current pulse: rectangle I²t, half-sine I²t/2, triangle I²t/3, exponential decay I²τ/2 [derived]. */
export function pulseI2t(
  shape: 'rectangle' | 'half-sine' | 'triangle' | 'exponential',
  peak: number,
  time: number,
): number {
  const k = { rectangle: 1, 'half-sine': 0.5, triangle: 1 / 3, exponential: 0.5 }[shape];
  return peak * peak * time * k;
}

export function totalVA(input: Pick<MainsFuseInput, 'load' | 'windings' | 'va'>): number {
  if (input.load === 'va') return input.va!;
  return input.windings.reduce((sum, w) => sum + w.volts * w.amps, 0);
}

/**
 * The least pre-arcing I²t IEC 60127-2 sheet 3 guarantees a time-lag fuse: it holds 10 × In for the
 * gate's minimum time, so (10 In)² × t_min [derived from the gate, docs/references.md §1].
 */
export function timeLagMinimumI2t(rating: number): number {
  const gate = TIME_LAG_GATES[TIME_LAG_GATES.length - 1]!;
  return (gate.multiple * rating) ** 2 * gate.min;
}

type Surge = { method: string; i2t: number; peak?: number; tau?: number };

/** The switch-on charging surge at the fuse, from a block's figure or the circuit; null without inputs. */
function knownSurge(input: MainsFuseInput): Surge | null {
  if (input.surgeI2t !== undefined) return { method: 'from the switch-on surge block', i2t: input.surgeI2t };
  const { surgeWindingVoltage: v, surgeSourceResistance: rs, surgeReservoir: c } = input;
  if (v === undefined || rs === undefined || c === undefined) return null;
  // Switched on at the mains peak into an empty reservoir, no rectifier drop (an upper figure, §10).
  const ratio = v / input.mainsVoltage;
  const peak = ((Math.SQRT2 * v) / rs) * ratio;
  const tau = rs * c;
  return { method: 'from the circuit', i2t: pulseI2t('exponential', peak, tau), peak, tau };
}

function compute(input: MainsFuseInput): ReckonerResult {
  const va = totalVA(input);
  const eta = input.efficiency / 100;
  const primary = va / (eta * input.mainsVoltage);
  const required = primary * input.margin;
  const rating = nextFuseRating(required, input.series);
  const series = FUSE_SERIES[input.series];
  if (rating === null) {
    const largest = series.values[series.values.length - 1]!;
    throw new ReckonerInputError(
      input.load === 'va' ? 'va' : 'windings',
      `needs ${formatQuantity(required, 'A')} of fuse, above the largest rating in the ${series.label} (${formatQuantity(largest, 'A')}); this reckoner covers miniature fuses only`,
    );
  }
  const outputs: ReckonerResult['outputs'] = {
    totalVA: q(
      va,
      'VA',
      'Total secondary load',
      input.load === 'va' ? 'As entered.' : 'Sum of volts × rms amps over the windings.',
      SRC.derived,
    ),
    primaryCurrent: q(
      primary,
      'A rms',
      'Primary current',
      `VA ÷ (efficiency ${formatNumber(input.efficiency)} % × ${formatQuantity(input.mainsVoltage, 'V')}).`,
      SRC.derived,
    ),
    requiredCurrent: q(
      required,
      'A rms',
      'Required fuse current',
      `Primary current × margin ${formatNumber(input.margin)}.`,
      SRC.commonPractice,
    ),
    fuseRating: q(
      rating,
      'A rms',
      'Fuse rating',
      `Next standard rating at or above the required current, from the ${series.label}.`,
      series.source,
    ),
    fuseType: s(
      input.fuseType,
      'Fuse type',
      input.fuseType === 'T'
        ? `Time-delay (T, slow-blow): switch-on draws the transformer’s magnetising surge and the reservoir charging surge, many times the running current for a few cycles. A quick-acting (F) fuse opens within ${formatQuantity(QUICK_ACTING_10X_MAX, 's')} at 10 × In and would blow on it.`
        : `Quick-acting (F), as chosen: it opens within ${formatQuantity(QUICK_ACTING_10X_MAX, 's')} at 10 × In, so the switch-on surge may blow it.`,
      `${SRC.commonPractice}; F-fuse gate: ${QUICK_ACTING_SOURCE}`,
    ),
    fuseDesignation: s(
      `${input.fuseType} ${formatQuantity(rating, 'A', 3)}`,
      'Fuse',
      'Type and rating to fit.',
      series.source,
    ),
  };
  const surge = knownSurge(input);
  outputs.inrushMethod = s(
    surge?.method ?? RULE_OF_THUMB,
    'Switch-on surge worked',
    surge
      ? 'The charging surge’s I²t is compared with the fuse’s pre-arcing I²t.'
      : 'Without the rectified winding, source resistance and reservoir (or a switch-on surge block) the surge is a multiple of the running current.',
    surge ? SRC.derived : SRC.commonPractice,
  );
  if (surge) Object.assign(outputs, surgeOutputs(input, surge, rating));
  else Object.assign(outputs, ruleOfThumbOutputs(input, primary, rating));
  return { outputs };
}

function surgeOutputs(input: MainsFuseInput, surge: Surge, rating: number): ReckonerResult['outputs'] {
  const maker = input.fuseI2t;
  const fuse = maker ?? (input.fuseType === 'T' ? timeLagMinimumI2t(rating) : undefined);
  const out: ReckonerResult['outputs'] = {
    surgeI2t: q(
      surge.i2t,
      'A²s',
      'Switch-on surge I²t in the fuse',
      surge.method === 'from the circuit'
        ? `I_pk² τ ÷ 2 for the charging surge, switched on at the mains peak into an empty reservoir; reflected to the primary by the turns ratio. An upper figure; the transformer’s magnetising surge comes on top.`
        : 'As worked by the switch-on surge block.',
      SRC.derived,
    ),
  };
  if (surge.peak !== undefined && surge.tau !== undefined) {
    out.surgePeak = q(
      surge.peak,
      'A peak',
      'Peak surge in the primary',
      '√2 V ÷ source resistance × turns ratio.',
      SRC.derived,
    );
    out.surgeTimeConstant = q(
      surge.tau,
      's',
      'Surge time constant',
      'Source resistance × reservoir.',
      SRC.derived,
    );
  }
  if (fuse === undefined) {
    out.inrushWithinGate = b(
      false,
      'Fuse holds the switch-on surge',
      'A quick-acting fuse has no guaranteed pre-arcing I²t: give the maker’s figure.',
      QUICK_ACTING_SOURCE,
    );
    return out;
  }
  out.fusePreArcingI2t = q(
    fuse,
    'A²s',
    'Fuse pre-arcing I²t',
    maker !== undefined
      ? 'As entered, from the maker’s data.'
      : `The least IEC 60127-2 allows a ${formatQuantity(rating, 'A', 3)} time-lag fuse: it must hold 10 × In for 10 ms. Makers’ figures are usually higher; enter one to use it.`,
    maker !== undefined ? 'fuse maker’s data sheet' : TIME_LAG_GATES_SOURCE,
  );
  out.surgeMargin = n(
    fuse / surge.i2t,
    'Fuse pre-arcing I²t ÷ surge I²t',
    'Above 1 the fuse survives the charging surge; keep a margin for the magnetising surge and ageing.',
    SRC.derived,
  );
  out.inrushWithinGate = b(
    fuse >= surge.i2t,
    'Fuse holds the switch-on surge',
    fuse >= surge.i2t
      ? 'The fuse’s pre-arcing I²t is above the surge’s.'
      : 'The surge’s I²t reaches the fuse’s pre-arcing I²t: it can open at switch-on.',
    SRC.derived,
  );
  return out;
}

function ruleOfThumbOutputs(
  input: MainsFuseInput,
  primary: number,
  rating: number,
): ReckonerResult['outputs'] {
  const inrush = primary * input.inrushMultiple;
  const multiple = inrush / rating;
  // Only time-lag fuses have a guaranteed holding time under a surge in the gates held here.
  const gate = input.fuseType === 'T' ? gateFor(multiple) : null;
  const holds = gate !== null && gate.min >= input.inrushDuration;
  const gateText =
    input.fuseType === 'F'
      ? `a quick-acting fuse is guaranteed no holding time under a surge; it opens within ${formatQuantity(QUICK_ACTING_10X_MAX, 's')} at 10 × In`
      : gate
        ? `at ≤ ${formatNumber(gate.multiple)} × In a time-lag fuse must not open before ${formatQuantity(gate.min, 's')} (and must by ${formatQuantity(gate.max, 's')})`
        : `above the highest tabulated gate (${formatNumber(TIME_LAG_GATES[TIME_LAG_GATES.length - 1]!.multiple)} × In): the standard gives no holding time`;
  return {
    inrushCurrent: q(
      inrush,
      'A rms',
      `Switch-on surge (${RULE_OF_THUMB})`,
      `Rule of thumb: about ${formatNumber(input.inrushMultiple)} × running current for roughly ${formatQuantity(input.inrushDuration, 's')}. An estimate, not a measurement: give the rectified winding, source resistance and reservoir to work it from the circuit.`,
      SRC.commonPractice,
    ),
    inrushMultipleOfRating: n(
      multiple,
      'Surge ÷ fuse rating',
      'How many times the fuse rating the surge estimate reaches.',
      SRC.derived,
    ),
    inrushGate: s(
      gateText,
      'Time-lag gate',
      'IEC 60127-2 pre-arcing time gates for time-lag (T) low-breaking-capacity fuses.',
      TIME_LAG_GATES_SOURCE,
    ),
    inrushWithinGate: b(
      holds,
      'Surge inside the guaranteed holding time',
      holds
        ? 'The gate’s minimum pre-arcing time covers the surge duration.'
        : 'The gate alone does not guarantee the fuse holds for the whole surge; compare with the fuse’s time-current curve or melting I²t.',
      TIME_LAG_GATES_SOURCE,
    ),
  };
}

function cautions(input: MainsFuseInput, result: ReckonerResult): Caution[] {
  const o = result.outputs;
  const holds = o.inrushWithinGate?.value === true;
  const multiple = Number(o.inrushMultipleOfRating?.value ?? 0);
  const worked = o.inrushMethod?.value !== RULE_OF_THUMB;
  const margin = o.surgeMargin ? Number(o.surgeMargin.value) : undefined;
  return compact([
    {
      level: 'danger',
      code: 'mains',
      message:
        'The primary circuit is at mains voltage. Fit the fuse in the live conductor, ahead of the switch where practice requires, with the unit disconnected.',
    },
    worked &&
      !holds && {
        level: 'warning',
        code: 'inrush',
        field: 'fuseI2t',
        message:
          margin === undefined
            ? 'A quick-acting fuse has no guaranteed pre-arcing I²t to set against the switch-on surge: enter the maker’s figure, or use a time-delay (T) fuse.'
            : `The switch-on charging surge (${formatNumber(1 / margin, 2)} × the fuse’s pre-arcing I²t) can open the fuse at switch-on. Add series resistance or a soft start, or choose a fuse with a larger pre-arcing I²t; never fit a larger rating without re-checking the design.`,
      },
    worked &&
      holds &&
      margin !== undefined &&
      margin < 2 && {
        level: 'note',
        code: 'inrush-margin',
        field: 'fuseI2t',
        message: `The fuse survives the charging surge with a margin of ${formatNumber(margin, 2)}: little room for the transformer’s magnetising surge and for ageing.`,
      },
    !worked &&
      !holds && {
        level: multiple > TIME_LAG_GATES[TIME_LAG_GATES.length - 1]!.multiple ? 'warning' : 'note',
        code: 'inrush',
        message:
          'The switch-on surge estimate is not covered by the time-lag gate alone. Check the chosen fuse’s melting I²t or time-current curve; a soft-start or thermistor may be needed if it opens at switch-on. Never replace it with a larger rating to stop nuisance blowing without re-checking the design.',
        source: TIME_LAG_GATES_SOURCE,
      },
    input.fuseType === 'F' && {
      level: 'warning',
      code: 'quick-acting-fuse',
      field: 'fuseType',
      message: `A quick-acting (F) fuse on a transformer input opens within ${formatQuantity(QUICK_ACTING_10X_MAX, 's')} at 10 × its rating, ${worked ? '' : `and the switch-on surge reaches about ${formatNumber(multiple)} × the rating chosen here: `}expect it to blow at switch-on. Use a time-delay (T) fuse.`,
      source: QUICK_ACTING_SOURCE,
    },
    input.margin < 1.1 && {
      level: 'note',
      code: 'margin',
      message:
        'A margin under 1.1 leaves the fuse running close to its rating; ageing fuses may open in normal use.',
    },
    LOCAL_CODES,
  ]);
}

export const mainsFuse: ReckonerDefinition<MainsFuseInput> = {
  kind: 'mains-fuse',
  label: 'Mains fuse',
  summary: 'Size the primary fuse from the transformer load, with its type and a switch-on surge check.',
  inputs,
  fields,
  compute,
  cautions,
  keyOutputs: ['totalVA', 'primaryCurrent', 'fuseDesignation', 'inrushWithinGate'],
};
