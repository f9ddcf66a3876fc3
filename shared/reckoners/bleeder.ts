/** Bleeder and discharge: how fast a charged capacitor falls below the hazard threshold. */
import { floorESeries } from '../standards/eSeries';
import {
  CHARGE_LIMIT_C,
  CHARGE_LIMIT_SOURCE,
  DISCHARGE_TIME_S,
  DISCHARGE_TIME_SOURCE,
  HAZARD_DC_SOURCE,
  HAZARD_DC_VOLTS,
  RESISTOR_DERATING,
} from '../standards/thresholds';
import { formatQuantity } from '../units/format';
import { compact, hazardousVoltage, LOCAL_CODES } from './cautions';
import { suggestedPowerRating } from './dropper-ladder';
import { defineInputs, optionalQuantity, quantity, rows, text, type InputOf } from './fields';
import { q, s, SRC } from './outputs';
import type { Caution, ReckonerDefinition, ReckonerResult } from './types';

const shape = {
  capacitance: quantity('F', {
    label: 'Capacitance',
    min: 1e-12,
    max: 1,
    plausible: { min: 1e-6, max: 0.05 },
  }),
  chargedVoltage: quantity('V dc', {
    label: 'Charged voltage',
    min: 1e-3,
    max: 5000,
    plausible: { min: 5, max: 2000 },
  }),
  bleederResistance: optionalQuantity('Ω', {
    label: 'Bleeder resistance',
    min: 1e-3,
    max: 1e9,
    plausible: { min: 1e3, max: 1e8 },
    help: 'Leave empty to get only the suggestion for the target time.',
  }),
  threshold: quantity('V dc', {
    label: 'Hazard threshold',
    default: HAZARD_DC_VOLTS,
    min: 1e-3,
    max: 1000,
    plausible: { min: 10, max: 120 },
    help: `Default 60 V DC: ${HAZARD_DC_SOURCE}. Some rules use 50 V (NFPA 70E, OSHA 29 CFR 1910.333).`,
  }),
  targetTime: quantity('s', {
    label: 'Target time to fall below the threshold',
    default: DISCHARGE_TIME_S,
    min: 1e-3,
    max: 3600,
    plausible: { min: 0.1, max: 600 },
    help: `Default 5 s: ${DISCHARGE_TIME_SOURCE}.`,
  }),
  elapsed: optionalQuantity('s', {
    label: 'Time after switch-off',
    min: 0,
    max: 86_400,
    plausible: { min: 0, max: 3600 },
    help: 'Gives the voltage left at that moment (needs the bleeder resistance).',
  }),
  milestones: rows(
    {
      label: text({ label: 'Name' }),
      volts: quantity('V dc', { label: 'Voltage', min: 1e-3, max: 5000, plausible: { min: 1, max: 1000 } }),
    },
    {
      label: 'Further thresholds',
      help: 'Other voltages the procedure names, e.g. 10 V before a probe goes on; each gets its time.',
      minRows: 0,
      maxRows: 10,
    },
  ),
};

const { schema: baseSchema, fields } = defineInputs(shape);
const inputs = baseSchema.superRefine((v, ctx) => {
  if (v.bleederResistance === undefined && (v.elapsed !== undefined || v.milestones.length > 0))
    ctx.addIssue({
      code: 'custom',
      path: ['bleederResistance'],
      message: 'is needed for the voltage after switch-off and the further thresholds',
    });
});
export type BleederInput = InputOf<typeof shape>;

/** t = R C ln(V0 / Vt) [derived]; 0 when already at or below the threshold. */
export function timeToFall(r: number, c: number, v0: number, vt: number): number {
  return v0 <= vt ? 0 : r * c * Math.log(v0 / vt);
}

/** v(t) = V0 e^(−t / RC) [derived]. */
export function voltageAfter(r: number, c: number, v0: number, t: number): number {
  return v0 * Math.exp(-t / (r * c));
}

/** Largest R that reaches vt within t: R = t / (C ln(V0/Vt)) [derived]. */
export function maxBleederFor(t: number, c: number, v0: number, vt: number): number {
  return t / (c * Math.log(v0 / vt));
}

function compute(input: BleederInput): ReckonerResult {
  const { capacitance: C, chargedVoltage: V0, threshold: Vt, targetTime } = input;
  const outputs: ReckonerResult['outputs'] = {
    storedEnergy: q(0.5 * C * V0 * V0, 'J', 'Stored energy', '½ C V².', SRC.derived),
    storedCharge: q(C * V0, 'C', 'Stored charge', 'C V.', SRC.derived),
  };
  const above = V0 > Vt;
  if (input.bleederResistance !== undefined) {
    const R = input.bleederResistance;
    outputs.timeConstant = q(R * C, 's', 'Time constant', 'R C.', SRC.derived);
    outputs.timeToThreshold = q(
      timeToFall(R, C, V0, Vt),
      's',
      `Time to fall below ${formatQuantity(Vt, 'V')}`,
      above
        ? 'R C ln(V₀ ÷ V_threshold), with the supply disconnected and no other load.'
        : 'Already at or below the threshold.',
      SRC.derived,
    );
    outputs.bleederDissipation = q(
      (V0 * V0) / R,
      'W',
      'Bleeder dissipation',
      'V² ÷ R at the charged voltage, continuous while powered.',
      SRC.derived,
    );
    outputs.bleederCurrent = q(
      V0 / R,
      'A dc',
      'Bleeder current',
      'V ÷ R; this adds to the supply’s load.',
      SRC.derived,
    );
    if (input.elapsed !== undefined)
      outputs.voltageAfter = q(
        voltageAfter(R, C, V0, input.elapsed),
        'V dc',
        `Voltage ${formatQuantity(input.elapsed, 's')} after switch-off`,
        'V₀ e^(−t ÷ RC).',
        SRC.derived,
      );
    input.milestones.forEach((m, i) => {
      outputs[`milestone${i + 1}`] = q(
        timeToFall(R, C, V0, m.volts),
        's',
        `Time to fall below ${m.label ? `${m.label} (${formatQuantity(m.volts, 'V')})` : formatQuantity(m.volts, 'V')}`,
        'R C ln(V₀ ÷ V).',
        SRC.derived,
      );
    });
  }
  if (above) {
    const rMax = maxBleederFor(targetTime, C, V0, Vt);
    const r = floorESeries(rMax, 'E12');
    const p = (V0 * V0) / r;
    outputs.maxBleeder = q(
      rMax,
      'Ω',
      `Largest bleeder for ${formatQuantity(targetTime, 's')}`,
      't ÷ (C ln(V₀ ÷ V_threshold)).',
      SRC.derived,
    );
    outputs.suggestedBleeder = q(
      r,
      'Ω',
      'Suggested bleeder (E12, at or below)',
      'The E12 value at or below the largest bleeder, so the time is met.',
      'IEC 60063 E12',
    );
    outputs.suggestedBleederDissipation = q(p, 'W', 'Suggested bleeder dissipation', 'V² ÷ R.', SRC.derived);
    outputs.suggestedBleederRating = q(
      suggestedPowerRating(p),
      'W',
      'Suggested bleeder rating',
      `Next common rating at or above ${RESISTOR_DERATING} × the dissipation.`,
      SRC.commonPractice,
    );
  } else {
    outputs.suggestedBleeder = s(
      'not needed for the threshold',
      'Suggested bleeder',
      'The charged voltage is already at or below the threshold.',
    );
  }
  return { outputs };
}

function cautions(input: BleederInput, result: ReckonerResult): Caution[] {
  const t = result.outputs.timeToThreshold?.value;
  const q = input.capacitance * input.chargedVoltage;
  return compact([
    hazardousVoltage(input.chargedVoltage, 'The capacitor', input.threshold),
    {
      level: 'danger',
      code: 'verify-discharge',
      message:
        'A bleeder can fail open. Always verify with a meter that the capacitor has discharged before touching, whatever this figure says.',
    },
    typeof t === 'number' &&
      t > input.targetTime && {
        level: 'warning',
        code: 'slow-discharge',
        message: `This bleeder takes ${formatQuantity(t, 's')} to fall below ${formatQuantity(input.threshold, 'V')}, longer than the ${formatQuantity(input.targetTime, 's')} target.`,
        source: DISCHARGE_TIME_SOURCE,
      },
    q > CHARGE_LIMIT_C &&
      input.chargedVoltage > input.threshold && {
        level: 'warning',
        code: 'stored-charge-limit',
        message: `Stored charge ${formatQuantity(q, 'C')} exceeds the ${formatQuantity(CHARGE_LIMIT_C, 'C')} limit for accessible parts.`,
        source: CHARGE_LIMIT_SOURCE,
      },
    LOCAL_CODES,
  ]);
}

export const bleeder: ReckonerDefinition<BleederInput> = {
  kind: 'bleeder',
  label: 'Bleeder and discharge',
  summary:
    'Time constant, time to fall below the hazard threshold, stored energy and a bleeder for a target time.',
  inputs,
  fields,
  compute,
  cautions,
  keyOutputs: ['timeToThreshold', 'bleederDissipation', 'suggestedBleeder', 'suggestedBleederRating'],
};
