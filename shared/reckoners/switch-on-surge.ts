/**
 * Switch-on surge from the circuit: an empty reservoir is a short circuit, so at switch-on (worst
 * case, at the mains peak) the charging current is limited only by the source resistance. Its I²t
 * is compared with the fuse's pre-arcing I²t and the diodes' surge rating. Without the circuit's
 * resistances the rule of thumb (a multiple of the running current) stands in, labelled as such.
 */
import { formatNumber, formatQuantity } from '../units/format';
import { compact, LOCAL_CODES } from './cautions';
import { ReckonerInputError } from './errors';
import { defineInputs, num, optionalQuantity, quantity, type InputOf } from './fields';
import { pulseI2t } from './mains-fuse';
import { n, q, s, SRC } from './outputs';
import { rectifierDrop } from './peak-no-load';
import { diodeDropField, rectifierField, requireValveDrop, valveDropField } from './rectifier';
import type { Caution, ReckonerDefinition, ReckonerResult } from './types';

const resistance = (label: string, help: string) =>
  optionalQuantity('Ω', { label, min: 0, max: 10_000, plausible: { min: 0, max: 1000 }, help });

const shape = {
  windingVoltage: quantity('V rms', {
    label: 'Winding voltage (rms)',
    min: 1e-3,
    max: 3000,
    plausible: { min: 2, max: 1500 },
    help: 'The rectified winding; one half of a centre-tapped winding.',
  }),
  mainsVoltage: quantity('V rms', {
    label: 'Mains voltage',
    default: 230,
    min: 50,
    max: 300,
    plausible: { min: 90, max: 260 },
    follows: 'mainsNominal',
    part: 'mains-nominal',
  }),
  rectifier: rectifierField(),
  diodeDrop: diodeDropField(),
  valveDrop: valveDropField(),
  secondaryResistance: resistance(
    'Secondary winding resistance',
    'Measured with an ohmmeter, unpowered; one half for a centre tap.',
  ),
  primaryResistance: resistance('Primary winding resistance', 'Measured unpowered, mains disconnected.'),
  seriesResistance: resistance(
    'Other series resistance',
    'A valve rectifier’s internal resistance, a surge resistor or thermistor (cold).',
  ),
  reservoir: quantity('F', {
    label: 'Reservoir capacitance',
    min: 1e-9,
    max: 1,
    plausible: { min: 1e-6, max: 0.01 },
  }),
  fuseI2t: optionalQuantity('A²s', {
    label: 'Fuse pre-arcing I²t',
    min: 1e-6,
    max: 1e6,
    plausible: { min: 1e-3, max: 1e4 },
    help: 'From the fuse maker’s data sheet for the chosen rating and type.',
  }),
  diodeSurge: optionalQuantity('A peak', {
    label: 'Diode surge rating, I_FSM (A peak)',
    min: 1e-3,
    max: 10_000,
    plausible: { min: 1, max: 1000 },
    help: 'Non-repetitive peak forward surge for one half-sine, from the diode’s data sheet.',
  }),
  mainsFrequency: quantity('Hz', {
    label: 'Mains frequency',
    default: 50,
    min: 16,
    max: 440,
    plausible: { min: 45, max: 65 },
    follows: 'mainsFrequency',
  }),
  runningCurrent: optionalQuantity('A rms', {
    label: 'Primary running current',
    min: 1e-4,
    max: 30,
    plausible: { min: 0.01, max: 10 },
    help: 'For the rule-of-thumb figure when the resistances are not known.',
  }),
  surgeMultiple: num({
    label: 'Rule-of-thumb surge (× running current)',
    default: 10,
    min: 1,
    max: 50,
    help: 'Used only without the winding resistances (common practice, no source).',
  }),
};

const { schema: baseSchema, fields } = defineInputs(shape);
export type SwitchOnSurgeInput = InputOf<typeof shape>;

const inputs = baseSchema.superRefine((v, ctx) => {
  requireValveDrop(v, ctx);
  const circuitKnown = v.secondaryResistance !== undefined && v.primaryResistance !== undefined;
  if (!circuitKnown && v.runningCurrent === undefined)
    ctx.addIssue({
      code: 'custom',
      path: ['secondaryResistance'],
      message: 'and the primary resistance are needed, or the running current for the rule-of-thumb figure',
    });
});

/** Source resistance seen from the secondary: R_s + R_p (N_s/N_p)² + R_other [derived]. */
export function sourceResistance(rSec: number, rPri: number, turnsRatio: number, rOther = 0): number {
  return rSec + rPri * turnsRatio * turnsRatio + rOther;
}

/** I²t of an exponential pulse i = I_pk e^(−t/τ): I_pk² τ / 2 [derived]. */
export const exponentialI2t = (peak: number, tau: number) => pulseI2t('exponential', peak, tau);

function compute(input: SwitchOnSurgeInput): ReckonerResult {
  const ratio = input.windingVoltage / input.mainsVoltage;
  const halfCycle = 1 / (2 * input.mainsFrequency);
  const outputs: ReckonerResult['outputs'] = {
    turnsRatio: n(
      ratio,
      'Turns ratio (secondary ÷ primary)',
      'Winding voltage ÷ mains voltage.',
      SRC.derived,
      4,
    ),
  };
  if (input.secondaryResistance === undefined || input.primaryResistance === undefined) {
    const running = input.runningCurrent!;
    outputs.method = s(
      'rule of thumb',
      'Method',
      'Without the winding resistances the surge is estimated from the running current.',
      SRC.commonPractice,
    );
    outputs.primaryPeak = q(
      running * input.surgeMultiple,
      'A peak',
      'Switch-on surge, rule of thumb',
      `${formatNumber(input.surgeMultiple)} × the running current: a rule of thumb, not worked from the circuit.`,
      SRC.commonPractice,
    );
    return { outputs };
  }
  const rs = sourceResistance(
    input.secondaryResistance,
    input.primaryResistance,
    ratio,
    input.seriesResistance ?? 0,
  );
  if (rs <= 0)
    throw new ReckonerInputError(
      'secondaryResistance',
      'with every resistance at zero nothing limits the surge: enter the measured winding resistances',
    );
  const vPeak = Math.SQRT2 * input.windingVoltage - rectifierDrop(input);
  if (vPeak <= 0) throw new ReckonerInputError('windingVoltage', 'gives no voltage above the rectifier drop');
  const peak = vPeak / rs;
  const tau = rs * input.reservoir;
  const secondaryI2t = exponentialI2t(peak, tau);
  const primaryPeak = peak * ratio;
  const primaryI2t = secondaryI2t * ratio * ratio;
  outputs.method = s('from the circuit', 'Method', 'Worked from the winding resistances and the reservoir.');
  outputs.sourceResistance = q(
    rs,
    'Ω',
    'Source resistance at the secondary',
    `R_secondary + R_primary × ${formatNumber(ratio, 3)}² + other series resistance.`,
    SRC.derived,
  );
  outputs.peakCurrent = q(
    peak,
    'A peak',
    'Peak charging current',
    'Peak secondary voltage less the rectifier drop ÷ source resistance, switched on at the mains peak into an empty reservoir.',
    SRC.derived,
  );
  outputs.timeConstant = q(tau, 's', 'Charging time constant', 'Source resistance × reservoir.', SRC.derived);
  outputs.diodeI2t = q(
    secondaryI2t,
    'A²s',
    'Surge I²t through the rectifier',
    'I_pk² τ ÷ 2 for an exponential pulse; an upper figure, as the mains falls from its peak as the reservoir charges.',
    SRC.derived,
  );
  outputs.primaryPeak = q(
    primaryPeak,
    'A peak',
    'Peak surge in the primary (charging only)',
    'The charging current reflected by the turns ratio; the transformer’s own magnetising surge comes on top.',
    SRC.derived,
  );
  outputs.fuseI2tDemand = q(
    primaryI2t,
    'A²s',
    'Surge I²t in the fuse',
    'The rectifier’s I²t × turns ratio².',
    SRC.derived,
  );
  if (input.fuseI2t !== undefined)
    outputs.fuseMargin = n(
      input.fuseI2t / primaryI2t,
      'Fuse pre-arcing I²t ÷ surge I²t',
      'Above 1 the fuse survives the charging surge; keep a margin for the magnetising surge and ageing.',
      SRC.derived,
    );
  if (input.diodeSurge !== undefined) {
    outputs.diodeSurgeI2t = q(
      pulseI2t('half-sine', input.diodeSurge, halfCycle),
      'A²s',
      'Diode surge rating as I²t',
      `I_FSM² × ${formatQuantity(halfCycle, 's')} ÷ 2: one half-sine at this mains frequency.`,
      SRC.derived,
    );
  }
  return { outputs };
}

function cautions(input: SwitchOnSurgeInput, result: ReckonerResult): Caution[] {
  const o = result.outputs;
  const peak = o.peakCurrent ? Number(o.peakCurrent.value) : undefined;
  const margin = o.fuseMargin ? Number(o.fuseMargin.value) : undefined;
  const diodeI2t = o.diodeI2t ? Number(o.diodeI2t.value) : undefined;
  const ratedI2t = o.diodeSurgeI2t ? Number(o.diodeSurgeI2t.value) : undefined;
  return compact([
    o.method?.value === 'rule of thumb' && {
      level: 'note',
      code: 'rule-of-thumb',
      message:
        'The surge here is a rule of thumb. Measure the winding resistances (unpowered) to work it from the circuit.',
      source: SRC.commonPractice,
    },
    margin !== undefined &&
      margin < 1 && {
        level: 'warning',
        code: 'fuse-opens-on-surge',
        field: 'fuseI2t',
        message: `The charging surge alone (${formatNumber(1 / margin, 2)} × the fuse’s pre-arcing I²t) can open the fuse at switch-on. Add series resistance or a soft start; do not fit a larger fuse without re-checking the design.`,
      },
    margin !== undefined &&
      margin >= 1 &&
      margin < 2 && {
        level: 'note',
        code: 'fuse-surge-margin',
        field: 'fuseI2t',
        message: `The fuse survives the charging surge with a margin of ${formatNumber(margin, 2)}: little room for the magnetising surge and for ageing.`,
      },
    peak !== undefined &&
      input.diodeSurge !== undefined &&
      (peak > input.diodeSurge || (diodeI2t ?? 0) > (ratedI2t ?? Infinity)) && {
        level: 'warning',
        code: 'diode-surge',
        field: 'diodeSurge',
        message: `The charging surge (${formatQuantity(peak, 'A')} peak) exceeds the diodes’ surge rating of ${formatQuantity(input.diodeSurge, 'A')}: choose diodes with a higher I_FSM or add series resistance.`,
      },
    LOCAL_CODES,
  ]);
}

export const switchOnSurge: ReckonerDefinition<SwitchOnSurgeInput> = {
  kind: 'switch-on-surge',
  label: 'Switch-on surge',
  summary:
    'Peak charging current and its I²t at switch-on, from the winding resistances and the reservoir, against the fuse and the diodes.',
  inputs,
  fields,
  compute,
  cautions,
  keyOutputs: ['peakCurrent', 'fuseI2tDemand', 'fuseMargin', 'primaryPeak'],
};
