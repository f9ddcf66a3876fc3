/**
 * Part-rating envelope at high mains: every part of the supply against what it sees at the shop's
 * high-mains figure — capacitors against the no-load peak (they sit there until the valves warm up),
 * the reservoir's ripple current, each resistor's dissipation and voltage with the shop's derating,
 * and the diodes' reverse voltage and switch-on surge. For a choke-input supply the capacitor after the
 * choke still must stand the no-load peak (below the critical current the output rises toward it), but
 * it carries only the choke's small 2f ripple current, and the choke holds down the switch-on surge.
 */
import { RESISTOR_DERATING } from '../standards/thresholds';
import { formatNumber, formatQuantity } from '../units/format';
import { CapInputOverload, simulateCapacitorInput } from './capacitor-input';
import { compact, hazardousVoltage, LOCAL_CODES } from './cautions';
import { ReckonerInputError } from './errors';
import { CHOKE_INPUT_RATIO, secondHarmonicPeak } from './choke-input';
import { defineInputs, optionalQuantity, quantity, rows, select, text, type InputOf } from './fields';
import { b, n, q, SRC } from './outputs';
import { rectifierDrop } from './peak-no-load';
import { diodeDropField, rectifierField, requireValveDrop, valveDropField } from './rectifier';
import type { Caution, ReckonerDefinition, ReckonerResult } from './types';

const shape = {
  windingVoltage: quantity('V rms', {
    label: 'Winding voltage (rms), rated',
    min: 1e-3,
    max: 3000,
    plausible: { min: 2, max: 1500 },
    help: 'At nominal mains and full load; one half of a centre-tapped winding.',
  }),
  highMains: quantity('%', {
    label: 'High mains, above nominal',
    default: 10,
    min: 0,
    max: 30,
    plausible: { min: 0, max: 15 },
    help: 'The shop’s figure for the highest mains, e.g. +10 % (IEC 60038 allows 230 V ± 10 %).',
  }),
  unloadedRise: quantity('%', {
    label: 'Unloaded rise of a rated winding',
    default: 10,
    min: 0,
    max: 50,
    plausible: { min: 0, max: 25 },
    help: 'Small transformers read 5–10 % above rating unloaded (common practice).',
  }),
  filter: select({
    label: 'Filter input',
    options: [
      { value: 'capacitor', label: 'Capacitor input (reservoir first)' },
      { value: 'choke', label: 'Choke input (choke first)' },
    ],
    default: 'capacitor',
  }),
  inputChoke: optionalQuantity('H', {
    label: 'Input choke inductance',
    min: 1e-3,
    max: 500,
    plausible: { min: 0.5, max: 50 },
    part: 'input-choke',
    help: 'Choke input only: at the lightest load (a swinging choke’s higher figure).',
  }),
  rectifier: rectifierField(),
  diodeDrop: diodeDropField(),
  valveDrop: valveDropField(),
  sourceResistance: quantity('Ω', {
    label: 'Source resistance',
    min: 1e-3,
    max: 10_000,
    plausible: { min: 1, max: 1000 },
    help: 'Winding plus reflected primary (see the transformer-loading block), plus any series resistor.',
  }),
  mainsFrequency: quantity('Hz', {
    label: 'Mains frequency',
    default: 50,
    min: 16,
    max: 440,
    plausible: { min: 45, max: 65 },
    follows: 'mainsFrequency',
  }),
  loadCurrent: quantity('A dc', {
    label: 'Load current (DC)',
    min: 0,
    max: 10,
    plausible: { min: 1e-3, max: 3 },
  }),
  reservoir: quantity('F', {
    label: 'Reservoir capacitance',
    min: 1e-9,
    max: 1,
    plausible: { min: 1e-6, max: 0.01 },
    help: 'Capacitor input: the reservoir. Choke input: the first capacitor, after the choke.',
  }),
  reservoirRippleRating: optionalQuantity('A rms', {
    label: 'Reservoir ripple-current rating',
    min: 1e-4,
    max: 100,
    plausible: { min: 0.01, max: 20 },
    help: 'From the capacitor’s data sheet, at the ripple frequency and its temperature.',
  }),
  capacitors: rows(
    {
      label: text({ label: 'Capacitor' }),
      rating: quantity('V dc', {
        label: 'Voltage rating',
        min: 1,
        max: 5000,
        plausible: { min: 6, max: 1000 },
        rating: 'capacitor-voltage',
      }),
    },
    { label: 'Filter capacitors (reservoir first)', minRows: 0, maxRows: 12 },
  ),
  resistors: rows(
    {
      label: text({ label: 'Resistor' }),
      resistance: quantity('Ω', {
        label: 'Resistance',
        min: 1e-3,
        max: 1e8,
        plausible: { min: 47, max: 1e6 },
      }),
      current: quantity('A dc', { label: 'Current', min: 0, max: 10, plausible: { min: 0, max: 1 } }),
      powerRating: quantity('W', {
        label: 'Power rating',
        min: 1e-3,
        max: 1000,
        plausible: { min: 0.1, max: 100 },
      }),
      voltageLimit: optionalQuantity('V dc', {
        label: 'Element voltage limit',
        min: 1,
        max: 10_000,
        plausible: { min: 50, max: 5000 },
      }),
    },
    { label: 'Resistors', minRows: 0, maxRows: 20 },
  ),
  resistorDerating: quantity('%', {
    label: 'Resistor derating: largest share of the rating used',
    default: 100 / RESISTOR_DERATING,
    min: 10,
    max: 100,
    plausible: { min: 25, max: 80 },
  }),
  diodePiv: optionalQuantity('V peak', {
    label: 'Diode reverse-voltage rating (V_RRM)',
    min: 1,
    max: 10_000,
    plausible: { min: 50, max: 5000 },
  }),
  diodeSurge: optionalQuantity('A peak', {
    label: 'Diode surge rating, I_FSM',
    min: 1e-3,
    max: 10_000,
    plausible: { min: 1, max: 1000 },
  }),
};

const { schema: baseSchema, fields } = defineInputs(shape);
export type PartRatingsInput = InputOf<typeof shape>;

const inputs = baseSchema.superRefine((v, ctx) => {
  requireValveDrop(v, ctx);
  if (v.filter === 'choke' && v.inputChoke === undefined)
    ctx.addIssue({ code: 'custom', path: ['inputChoke'], message: 'is required for a choke-input filter' });
});

/** Reverse voltage per diode: √2 V for a bridge, 2√2 V of a half-winding for a centre tap [derived]. */
const pivFactor = (r: PartRatingsInput['rectifier']) =>
  r === 'silicon-bridge' ? Math.SQRT2 : 2 * Math.SQRT2;

function compute(input: PartRatingsInput): ReckonerResult {
  const high = 1 + input.highMains / 100;
  const drop = rectifierDrop(input);
  const windingHigh = input.windingVoltage * high;
  const peakHigh = Math.SQRT2 * windingHigh * (1 + input.unloadedRise / 100) - drop;
  if (peakHigh <= 0)
    throw new ReckonerInputError('windingVoltage', 'gives no voltage above the rectifier drop');
  const outputs: ReckonerResult['outputs'] = {
    noLoadPeakHigh: q(
      peakHigh,
      'V dc',
      'No-load peak at high mains',
      `√2 × the winding at +${formatNumber(input.highMains)} % mains and +${formatNumber(input.unloadedRise)} % unloaded rise, less the rectifier drop.`,
      SRC.derived,
    ),
  };
  const choke = input.filter === 'choke' ? chokeInputStress(input, windingHigh, drop) : null;
  if (choke) Object.assign(outputs, choke.outputs);
  else
    outputs.reservoirRippleCurrent = q(
      capacitorInputRipple(input, windingHigh, drop),
      'A rms',
      'Reservoir ripple current at high mains',
      'From the capacitor-input solver at the high-mains winding voltage and the load current.',
      SRC.derived,
    );
  input.capacitors.forEach((c, i) => {
    outputs[`capacitor${i + 1}.margin`] = q(
      c.rating - peakHigh,
      'V dc',
      `${c.label ?? `Capacitor ${i + 1}`}: rating less the no-load peak`,
      'Every filter capacitor sits near the no-load peak until the valves draw current.',
      SRC.derived,
    );
  });
  const allowed = input.resistorDerating / 100;
  input.resistors.forEach((r, i) => {
    const name = r.label ?? `Resistor ${i + 1}`;
    const p = r.current * r.current * r.resistance;
    outputs[`resistor${i + 1}.dissipation`] = q(p, 'W', `${name}: dissipation`, 'I² × R.', SRC.derived);
    outputs[`resistor${i + 1}.withinDerating`] = b(
      p <= allowed * r.powerRating,
      `${name}: within the derating`,
      `At most ${formatNumber(input.resistorDerating)} % of the ${formatQuantity(r.powerRating, 'W')} rating.`,
    );
    outputs[`resistor${i + 1}.voltage`] = q(
      r.current * r.resistance,
      'V dc',
      `${name}: voltage across`,
      'I × R.',
      SRC.derived,
    );
  });
  if (input.rectifier !== 'valve') {
    outputs.diodePiv = q(
      pivFactor(input.rectifier) * windingHigh * (1 + input.unloadedRise / 100),
      'V peak',
      'Diode reverse voltage at high mains',
      input.rectifier === 'silicon-bridge'
        ? '√2 × the winding, unloaded.'
        : '2√2 × the half-winding, unloaded.',
      SRC.derived,
    );
    const byResistance = (Math.SQRT2 * windingHigh - drop) / input.sourceResistance;
    outputs.diodeSurgePeak = q(
      choke ? Math.min(byResistance, choke.surgeByChoke) : byResistance,
      'A peak',
      'Switch-on surge at high mains',
      choke
        ? 'At most the peak ÷ √(L ÷ C) (the choke and the empty capacitor, no loss) and the peak ÷ source resistance, whichever is less.'
        : 'Peak ÷ source resistance into an empty reservoir.',
      SRC.derived,
    );
  }
  outputs.partsChecked = n(
    input.capacitors.length + input.resistors.length + 1,
    'Parts checked',
    'The reservoir, each listed capacitor and each resistor.',
  );
  return { outputs };
}

function capacitorInputRipple(input: PartRatingsInput, windingHigh: number, drop: number): number {
  try {
    return simulateCapacitorInput({
      vPeak: Math.SQRT2 * windingHigh,
      drop,
      rSource: input.sourceResistance,
      capacitance: input.reservoir,
      frequency: input.mainsFrequency,
      loadCurrent: input.loadCurrent,
    }).capacitorRmsCurrent;
  } catch (e) {
    if (e instanceof CapInputOverload)
      throw new ReckonerInputError('loadCurrent', `too high for this winding and reservoir: ${e.message}`);
    throw e;
  }
}

/**
 * Choke input at high mains (docs/references.md §3): the DC is 2√2/π × rms less the drops; the first
 * capacitor carries the choke's 2f ripple current, (4 V_pk ÷ 3π) ÷ |2ωL − 1 ÷ 2ωC|, as long as the load
 * keeps the choke conducting (above V_dc ÷ 3ωL). At switch-on the choke and the empty capacitor
 * ring: the current stays under V_pk √(C ÷ L) [derived: ½ L i² ≤ ½ C V_pk²].
 */
function chokeInputStress(input: PartRatingsInput, windingHigh: number, drop: number) {
  const L = input.inputChoke!;
  const C = input.reservoir;
  const w = 2 * Math.PI * input.mainsFrequency;
  const w2 = 2 * w;
  const vPeak = Math.SQRT2 * windingHigh;
  const dc = CHOKE_INPUT_RATIO * windingHigh - drop - input.loadCurrent * input.sourceResistance;
  if (dc <= 0)
    throw new ReckonerInputError('loadCurrent', 'leaves no DC after the rectifier and resistance drops');
  const ripple = secondHarmonicPeak(vPeak) / Math.abs(w2 * L - 1 / (w2 * C)) / Math.SQRT2;
  const critical = dc / (3 * w * L);
  return {
    critical,
    surgeByChoke: (vPeak - drop) * Math.sqrt(C / L),
    outputs: {
      loadedOutputHigh: q(
        dc,
        'V dc',
        'Loaded output at high mains (choke input)',
        `2√2 ÷ π × the winding at +${formatNumber(input.highMains)} % mains, less the rectifier drop and load current × source resistance.`,
        SRC.derived,
      ),
      reservoirRippleCurrent: q(
        ripple,
        'A rms',
        'Ripple current in the capacitor after the choke, at high mains',
        'The 2f term of the rectified wave (4 V_pk ÷ 3π) driven through the choke and capacitor: ÷ |2ωL − 1 ÷ 2ωC|, rms. Holds while the choke conducts all the time.',
        SRC.derived,
      ),
      criticalCurrent: q(
        critical,
        'A dc',
        'Least load that keeps the choke conducting',
        'V_dc ÷ 3ωL (critical inductance, ω the mains angular frequency).',
        SRC.derived,
      ),
    } satisfies ReckonerResult['outputs'],
  };
}

function cautions(input: PartRatingsInput, result: ReckonerResult): Caution[] {
  const o = result.outputs;
  const peak = Number(o.noLoadPeakHigh!.value);
  const rippleI = Number(o.reservoirRippleCurrent!.value);
  const piv = o.diodePiv ? Number(o.diodePiv.value) : undefined;
  const surge = o.diodeSurgePeak ? Number(o.diodeSurgePeak.value) : undefined;
  const critical = o.criticalCurrent ? Number(o.criticalCurrent.value) : undefined;
  return compact([
    critical !== undefined &&
      input.loadCurrent < critical && {
        level: 'warning',
        code: 'below-critical',
        field: 'inputChoke',
        message: `At ${formatQuantity(input.loadCurrent, 'A')} the choke does not conduct all the time (it needs ${formatQuantity(critical, 'A')}): the capacitor charges toward the no-load peak of ${formatQuantity(peak, 'V')} and carries peaky charging current; the ripple-current figure does not hold.`,
      },
    hazardousVoltage(peak, 'At high mains with no load the filter'),
    ...input.capacitors.map((c, i): Caution | null =>
      c.rating < peak
        ? {
            level: 'danger',
            code: 'capacitor-under-rated',
            field: `capacitors.${i}.rating`,
            message: `${c.label ?? `Capacitor ${i + 1}`} is rated ${formatQuantity(c.rating, 'V')} but sees up to ${formatQuantity(peak, 'V')} at high mains with no load: it can fail, violently.`,
          }
        : null,
    ),
    input.reservoirRippleRating !== undefined &&
      rippleI > input.reservoirRippleRating && {
        level: 'warning',
        code: 'ripple-current',
        field: 'reservoirRippleRating',
        message: `The reservoir carries ${formatQuantity(rippleI, 'A')} rms of ripple current at high mains, above its ${formatQuantity(input.reservoirRippleRating, 'A')} rating: it runs hot and ages early.`,
      },
    ...input.resistors.flatMap((r, i): (Caution | null)[] => {
      const name = r.label ?? `Resistor ${i + 1}`;
      const p = r.current * r.current * r.resistance;
      const v = r.current * r.resistance;
      return [
        p > (input.resistorDerating / 100) * r.powerRating
          ? {
              level: 'warning',
              code: 'resistor-dissipation',
              field: `resistors.${i}.powerRating`,
              message: `${name} dissipates ${formatQuantity(p, 'W')}, more than ${formatNumber(input.resistorDerating)} % of its ${formatQuantity(r.powerRating, 'W')} rating.`,
            }
          : null,
        r.voltageLimit !== undefined && Math.max(v, peak) > r.voltageLimit
          ? {
              level: 'warning',
              code: 'resistor-voltage',
              field: `resistors.${i}.voltageLimit`,
              message: `${name} can see up to ${formatQuantity(Math.max(v, peak), 'V')} (at switch-on one end sits at the no-load peak while the other is near 0 V), above its ${formatQuantity(r.voltageLimit, 'V')} element limit.`,
            }
          : null,
      ];
    }),
    piv !== undefined &&
      input.diodePiv !== undefined &&
      input.diodePiv < piv && {
        level: 'danger',
        code: 'diode-piv',
        field: 'diodePiv',
        message: `The diodes see ${formatQuantity(piv, 'V')} in reverse at high mains, above their ${formatQuantity(input.diodePiv, 'V')} rating.`,
      },
    surge !== undefined &&
      input.diodeSurge !== undefined &&
      surge > input.diodeSurge && {
        level: 'warning',
        code: 'diode-surge',
        field: 'diodeSurge',
        message: `The switch-on surge of about ${formatQuantity(surge, 'A')} exceeds the diodes’ ${formatQuantity(input.diodeSurge, 'A')} surge rating.`,
      },
    LOCAL_CODES,
  ]);
}

export const partRatings: ReckonerDefinition<PartRatingsInput> = {
  kind: 'part-ratings',
  label: 'Part ratings at high mains',
  summary:
    'Capacitor voltages, reservoir ripple current, resistor dissipation and voltage, and diode reverse voltage and surge, all at the shop’s high-mains figure.',
  inputs,
  fields,
  compute,
  cautions,
  keyOutputs: ['noLoadPeakHigh', 'reservoirRippleCurrent', 'margin', 'diodePiv'],
  noLoadOutputs: ['noLoadPeakHigh'],
};
