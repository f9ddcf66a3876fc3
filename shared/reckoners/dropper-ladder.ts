/**
 * Dropping-resistor ladder: from a start node through a chain of RC or LC stages. Each resistor
 * (or choke) carries the current of its own node and of every node after it (each node draws a
 * fixed current). The ripple frequency follows the mains frequency parameter and the rectifier.
 *
 * A stage may name the resistor actually fitted. Its node voltage then follows from that part and
 * the start voltage — so a bench run at the measured mains moves it with the mains — while the
 * exact value for the target and the nearest E12/E24 values are still reported for comparison.
 * A stage without a fitted value uses the nearest value of the chosen series, as when designing.
 */
import { nearestESeries } from '../standards/eSeries';
import { RESISTOR_DERATING, RESISTOR_POWER_RATINGS } from '../standards/thresholds';
import { formatQuantity } from '../units/format';
import { parseQuantity } from '../units/parse';
import { compact, hazardousVoltage, LOCAL_CODES, resonanceNearRipple } from './cautions';
import { z } from 'zod';
import { defineInputs, optionalQuantity, quantity, rows, select, text, type InputOf } from './fields';
import { ReckonerInputError } from './errors';
import { n, q, SRC } from './outputs';
import type { Caution, ReckonerDefinition, ReckonerResult } from './types';

const shape = {
  startVoltage: quantity('V dc', {
    label: 'Start node voltage',
    min: 1e-3,
    max: 3000,
    plausible: { min: 5, max: 1500 },
  }),
  stages: rows(
    {
      label: text({ label: 'Node' }),
      targetVoltage: quantity('V dc', {
        label: 'Target voltage',
        min: 1e-3,
        max: 3000,
        plausible: { min: 1, max: 1500 },
      }),
      current: quantity('A dc', {
        label: 'Current drawn at this node',
        min: 0,
        max: 10,
        plausible: { min: 0, max: 0.5 },
      }),
      capacitance: quantity('F', {
        label: 'Filter capacitor',
        min: 1e-12,
        max: 0.1,
        plausible: { min: 1e-7, max: 5e-3 },
      }),
      capacitorRating: optionalQuantity('V dc', {
        label: 'Capacitor voltage rating',
        min: 1,
        max: 5000,
        plausible: { min: 6, max: 1000 },
        rating: 'capacitor-voltage',
        help: 'The filter capacitor’s marked working voltage; checked against the no-load peak at high mains.',
      }),
      element: select({
        label: 'Series part',
        options: [
          { value: 'resistor', label: 'Resistor (RC section)' },
          { value: 'choke', label: 'Choke (LC section)' },
        ],
        default: 'resistor',
      }),
      inductance: optionalQuantity('H', {
        label: 'Choke inductance',
        min: 1e-4,
        max: 500,
        plausible: { min: 0.1, max: 50 },
        help: 'Required for a choke; its DC resistance goes in the fitted-resistance column.',
      }),
      fittedResistance: optionalQuantity('Ω', {
        label: 'Fitted resistor (a choke’s DC resistance)',
        min: 0.1,
        max: 1e8,
        plausible: { min: 10, max: 1e6 },
        help: 'The dropping resistor in the unit (e.g. "4k7"). When given, this and later node voltages are computed with it; leave empty to use the nearest standard value.',
      }),
    },
    { label: 'Stages', minRows: 1, maxRows: 12 },
  ),
  series: select({
    label: 'Fit values from',
    options: [
      { value: 'E12', label: 'E12 (IEC 60063)' },
      { value: 'E24', label: 'E24 (IEC 60063)' },
    ],
    default: 'E12',
  }),
  mainsFrequency: quantity('Hz', {
    label: 'Mains frequency',
    default: 50,
    min: 16,
    max: 440,
    plausible: { min: 45, max: 65 },
    follows: 'mainsFrequency',
  }),
  rectification: select({
    label: 'Rectification',
    options: [
      { value: 'full-wave', label: 'Full-wave (bridge or centre tap): ripple at twice the mains' },
      { value: 'half-wave', label: 'Half-wave: ripple at the mains frequency' },
    ],
    default: 'full-wave',
  }),
  startRipple: optionalQuantity('V peak-to-peak', {
    label: 'Ripple at the start node (peak to peak)',
    min: 0,
    max: 1000,
    plausible: { min: 0, max: 100 },
  }),
};

const { schema: baseSchema, fields } = defineInputs(shape);
export type DropperLadderInput = InputOf<typeof shape>;

/**
 * Blocks written before the ripple frequency followed the mains carry a typed `rippleFrequency`; an
 * approved revision must evaluate as it did, so it is read as full-wave on half that mains.
 */
function retireRippleFrequency(raw: unknown): unknown {
  if (!raw || typeof raw !== 'object' || Array.isArray(raw) || !('rippleFrequency' in raw)) return raw;
  const { rippleFrequency, ...rest } = raw as Record<string, unknown>;
  if (rest.mainsFrequency !== undefined && rest.mainsFrequency !== '') return rest;
  let ripple = Number.NaN;
  if (typeof rippleFrequency === 'number') ripple = rippleFrequency;
  else if (typeof rippleFrequency === 'string') {
    try {
      ripple = parseQuantity(rippleFrequency, 'Hz').value;
    } catch {
      // Unreadable: dropped, and the block follows the mains frequency parameter like a new one.
    }
  }
  return Number.isFinite(ripple) ? { ...rest, mainsFrequency: ripple / 2, rectification: 'full-wave' } : rest;
}

const refined = baseSchema.superRefine((v, ctx) => {
  v.stages.forEach((st, i) => {
    if (st.element !== 'choke') return;
    if (st.inductance === undefined)
      ctx.addIssue({ code: 'custom', path: ['stages', i, 'inductance'], message: 'is required for a choke' });
    if (st.fittedResistance === undefined)
      ctx.addIssue({
        code: 'custom',
        path: ['stages', i, 'fittedResistance'],
        message: 'is required for a choke: its DC resistance',
      });
  });
  let previous = v.startVoltage;
  v.stages.forEach((st, i) => {
    if (st.targetVoltage >= previous) {
      ctx.addIssue({
        code: 'custom',
        path: ['stages', i, 'targetVoltage'],
        message: `must be below the node before it (${formatQuantity(previous, 'V')})`,
      });
    }
    previous = st.targetVoltage;
  });
  // Every resistor must carry some current, or its drop cannot be set.
  let downstream = 0;
  for (let i = v.stages.length - 1; i >= 0; i--) {
    downstream += v.stages[i]!.current;
    if (downstream <= 0) {
      ctx.addIssue({
        code: 'custom',
        path: ['stages', i, 'current'],
        message: 'no current flows through this stage’s resistor; a drop needs current',
      });
    }
  }
});
const inputs = z.preprocess(retireRippleFrequency, refined) as unknown as typeof refined;

/** LC stage attenuation A = 1 / |1 − (2π f)² L C| [derived; docs/references.md §3]. */
export function lcAttenuation(l: number, c: number, f: number): number {
  const w = 2 * Math.PI * f;
  return 1 / Math.abs(1 - w * w * l * c);
}

/** RC stage attenuation A = X_C / √(R² + X_C²), X_C = 1 / (2π f C) [derived]. */
export function rcAttenuation(r: number, c: number, f: number): number {
  const xc = 1 / (2 * Math.PI * f * c);
  return xc / Math.hypot(r, xc);
}

export function lcResonance(l: number, c: number): number {
  return 1 / (2 * Math.PI * Math.sqrt(l * c));
}

export function rippleFrequencyOf(
  input: Pick<DropperLadderInput, 'mainsFrequency' | 'rectification'>,
): number {
  return input.rectification === 'full-wave' ? 2 * input.mainsFrequency : input.mainsFrequency;
}

export function suggestedPowerRating(dissipation: number): number {
  const need = dissipation * RESISTOR_DERATING;
  return RESISTOR_POWER_RATINGS.find((p) => p >= need) ?? Math.ceil(need);
}

function compute(input: DropperLadderInput): ReckonerResult {
  const outputs: ReckonerResult['outputs'] = {};
  const through: number[] = [];
  let acc = 0;
  for (let i = input.stages.length - 1; i >= 0; i--) {
    acc += input.stages[i]!.current;
    through[i] = acc;
  }
  let prevTarget = input.startVoltage;
  let prevActual = input.startVoltage;
  let ripple = input.startRipple;
  const rippleFrequency = rippleFrequencyOf(input);
  outputs.rippleFrequency = q(
    rippleFrequency,
    'Hz',
    'Ripple frequency',
    input.rectification === 'full-wave'
      ? 'Twice the mains frequency (full-wave).'
      : 'The mains frequency (half-wave).',
    SRC.derived,
  );
  input.stages.forEach((st, i) => {
    const key = `stage${i + 1}`;
    const name = st.label ?? `Stage ${i + 1}`;
    const I = through[i]!;
    if (!(I > 0))
      throw new ReckonerInputError(`stages.${i}.current`, 'no current flows through this stage’s resistor');
    const choke = st.element === 'choke' ? st.inductance! : undefined;
    const exact = (prevTarget - st.targetVoltage) / I;
    const e12 = nearestESeries(exact, 'E12');
    const e24 = nearestESeries(exact, 'E24');
    const fitted = st.fittedResistance;
    const used = fitted ?? (input.series === 'E12' ? e12 : e24);
    const usedText =
      choke !== undefined
        ? `the choke’s ${formatQuantity(used, 'Ω')}`
        : fitted !== undefined
          ? `the fitted ${formatQuantity(used, 'Ω')}`
          : `the nearest ${input.series} value, ${formatQuantity(used, 'Ω')}`;
    const node = prevActual - used * I;
    if (!(node > 0)) {
      throw new ReckonerInputError(
        fitted !== undefined ? `stages.${i}.fittedResistance` : `stages.${i}.targetVoltage`,
        `with ${usedText} carrying ${formatQuantity(I, 'A')}, this node falls to ${formatQuantity(node, 'V')} from ${formatQuantity(prevActual, 'V')}: ` +
          (fitted !== undefined
            ? 'check the fitted value and the currents'
            : 'the targets and currents do not fit the standard values; revise the chain'),
      );
    }
    const power = I * I * used;
    const att =
      choke !== undefined
        ? lcAttenuation(choke, st.capacitance, rippleFrequency)
        : rcAttenuation(used, st.capacitance, rippleFrequency);
    if (choke !== undefined)
      outputs[`${key}.resonance`] = q(
        lcResonance(choke, st.capacitance),
        'Hz',
        `${name}: LC resonance`,
        '1 ÷ (2π √(L C)); keep it well below the ripple frequency.',
        SRC.derived,
      );
    if (choke === undefined) {
      outputs[`${key}.resistanceExact`] = q(
        exact,
        'Ω',
        `${name}: exact resistance`,
        'R = ΔV ÷ I from the previous target (the start voltage for the first stage) to this target, with I the current of this node and all after it. For comparison when a resistor is fitted.',
        SRC.derived,
      );
      outputs[`${key}.resistanceE12`] = q(
        e12,
        'Ω',
        `${name}: nearest E12`,
        'Nearest to the exact resistance on a log scale; a suggestion, not necessarily the fitted part.',
        'IEC 60063 E12',
      );
      outputs[`${key}.resistanceE24`] = q(
        e24,
        'Ω',
        `${name}: nearest E24`,
        'Nearest to the exact resistance on a log scale; a suggestion, not necessarily the fitted part.',
        'IEC 60063 E24',
      );
    }
    outputs[`${key}.resistance`] = q(
      used,
      'Ω',
      choke !== undefined
        ? `${name}: choke DC resistance`
        : fitted !== undefined
          ? `${name}: fitted resistor`
          : `${name}: resistor used (${input.series})`,
      fitted !== undefined
        ? 'The resistor given as fitted; node voltage, dissipation and attenuation use it.'
        : `No fitted value given: the nearest ${input.series} value to the exact resistance; node voltage, dissipation and attenuation use it.`,
      fitted !== undefined ? undefined : `IEC 60063 ${input.series}`,
    );
    outputs[`${key}.current`] = q(
      I,
      'A dc',
      `${name}: resistor current`,
      'This node’s current plus every later node’s.',
      SRC.derived,
    );
    outputs[`${key}.nodeVoltage`] = q(
      node,
      'V dc',
      fitted !== undefined
        ? `${name}: node voltage with the fitted resistor`
        : `${name}: node voltage with ${input.series} values`,
      `Previous node’s computed voltage (${formatQuantity(prevActual, 'V')}) less ${usedText} × ${formatQuantity(I, 'A')}.`,
      SRC.derived,
    );
    outputs[`${key}.dissipationExact`] = q(
      I * (prevTarget - st.targetVoltage),
      'W',
      `${name}: dissipation at the exact value`,
      'ΔV × I, with ΔV from the previous target to this target.',
      SRC.derived,
    );
    outputs[`${key}.dissipation`] = q(
      power,
      'W',
      `${name}: dissipation`,
      `I² × R with ${usedText}.`,
      SRC.derived,
    );
    outputs[`${key}.powerRating`] = q(
      suggestedPowerRating(power),
      'W',
      `${name}: suggested rating`,
      'Next common rating at or above twice the dissipation; check the element voltage limit on HT parts.',
      SRC.commonPractice,
    );
    outputs[`${key}.attenuation`] = n(
      att,
      `${name}: ripple attenuation`,
      choke !== undefined
        ? `1 ÷ |1 − ω² L C| of this LC stage alone at ${formatQuantity(rippleFrequency, 'Hz')}, ignoring loading by later stages.`
        : `X_C ÷ √(R² + X_C²) of this RC stage alone with ${usedText} at ${formatQuantity(rippleFrequency, 'Hz')}, ignoring loading by later stages.`,
      SRC.derived,
      4,
    );
    outputs[`${key}.attenuationDb`] = n(
      20 * Math.log10(att),
      `${name}: ripple attenuation (dB)`,
      '20 log₁₀ of the attenuation.',
      SRC.derived,
    );
    if (ripple !== undefined) {
      ripple = ripple * att;
      outputs[`${key}.ripple`] = q(
        ripple,
        'V peak-to-peak',
        `${name}: ripple (peak to peak)`,
        'Previous node’s ripple × this stage’s attenuation.',
        SRC.derived,
      );
    }
    prevTarget = st.targetVoltage;
    prevActual = node;
  });
  const anyFitted = input.stages.some((st) => st.fittedResistance !== undefined);
  const allFitted = input.stages.every((st) => st.fittedResistance !== undefined);
  outputs.finalVoltage = q(
    prevActual,
    'V dc',
    'Last node voltage',
    allFitted
      ? 'With the fitted resistors.'
      : anyFitted
        ? `With the fitted resistors where given, ${input.series} values elsewhere.`
        : `With ${input.series} values.`,
    SRC.derived,
  );
  return { outputs };
}

function cautions(input: DropperLadderInput): Caution[] {
  // A node at or below zero is an input error raised by compute, never a caution.
  const fr = rippleFrequencyOf(input);
  return compact([
    hazardousVoltage(input.startVoltage, 'The dropper chain'),
    ...input.stages.map((st, i) =>
      st.element === 'choke' && st.inductance !== undefined
        ? resonanceNearRipple(
            lcResonance(st.inductance, st.capacitance),
            fr,
            `stages.${i}.inductance`,
            st.label ?? `Stage ${i + 1}`,
          )
        : null,
    ),
    {
      level: 'note',
      code: 'resistor-voltage',
      message:
        'Check each dropping resistor’s element voltage limit as well as its power; HT drops can exceed the limit of small parts.',
    },
    LOCAL_CODES,
  ]);
}

export const dropperLadder: ReckonerDefinition<DropperLadderInput> = {
  kind: 'dropper-ladder',
  label: 'Dropping-resistor ladder',
  summary: 'Resistors, standard values, node voltages, dissipation and ripple attenuation along a B+ chain.',
  inputs,
  fields,
  compute,
  cautions,
  keyOutputs: ['resistance', 'nodeVoltage', 'powerRating', 'finalVoltage'],
};
