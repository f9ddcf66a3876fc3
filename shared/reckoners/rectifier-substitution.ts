/**
 * Rectifier substitution: a valve rectifier swapped for silicon diodes (or back, or one valve for
 * another). The drop changes, so every filter node moves by the same amount at the same currents;
 * a series resistor can put B+ back. Silicon also conducts at once, so the filter sits at the
 * no-load peak until the amplifier's valves warm up and draw current.
 */
import { nearestESeries } from '../standards/eSeries';
import { RESISTOR_DERATING } from '../standards/thresholds';
import { formatQuantity } from '../units/format';
import { compact, hazardousVoltage, LOCAL_CODES } from './cautions';
import { suggestedPowerRating } from './dropper-ladder';
import { defineInputs, optionalQuantity, quantity, rows, select, text, type InputOf } from './fields';
import { q, s, SRC } from './outputs';
import { diodeDropField } from './rectifier';
import type { Caution, ReckonerDefinition, ReckonerResult } from './types';

const RECTIFIERS = [
  { value: 'valve', label: 'Valve rectifier' },
  { value: 'silicon', label: 'Silicon diodes' },
] as const;

const valveDrop = (label: string) =>
  optionalQuantity('V dc', {
    label,
    min: 0,
    max: 200,
    plausible: { min: 2, max: 100 },
    help: 'At the load current, from the valve’s data sheet curves.',
  });

const shape = {
  windingVoltage: quantity('V rms', {
    label: 'Winding voltage (rms)',
    min: 1e-3,
    max: 3000,
    plausible: { min: 2, max: 1500 },
    help: 'One half of a centre-tapped winding.',
  }),
  circuit: select({
    label: 'Circuit',
    options: [
      { value: 'centre-tap', label: 'Full-wave, centre-tapped winding' },
      { value: 'bridge', label: 'Bridge' },
    ],
    default: 'centre-tap',
  }),
  from: select({ label: 'Fitted now', options: RECTIFIERS, default: 'valve' }),
  to: select({ label: 'Replacing it with', options: RECTIFIERS, default: 'silicon' }),
  fromValveDrop: valveDrop('Drop of the fitted valve'),
  toValveDrop: valveDrop('Drop of the new valve'),
  diodeDrop: diodeDropField(),
  loadCurrent: quantity('A dc', {
    label: 'Load current (DC)',
    min: 1e-6,
    max: 10,
    plausible: { min: 1e-3, max: 3 },
  }),
  nodes: rows(
    {
      label: text({ label: 'Node' }),
      volts: quantity('V dc', {
        label: 'Voltage with the fitted rectifier',
        min: 1e-3,
        max: 3000,
        plausible: { min: 1, max: 1500 },
      }),
    },
    { label: 'Filter nodes', minRows: 0, maxRows: 12 },
  ),
  highMains: quantity('%', {
    label: 'High mains, above nominal',
    default: 10,
    min: 0,
    max: 30,
    plausible: { min: 0, max: 15 },
    help: 'The shop’s figure for the highest mains, e.g. +10 % (IEC 60038 allows 230 V ± 10 %).',
  }),
  diodePiv: optionalQuantity('V peak', {
    label: 'Diode reverse-voltage rating (V_RRM)',
    min: 1,
    max: 10_000,
    plausible: { min: 50, max: 5000 },
  }),
  outputWarmUp: quantity('s', {
    label: 'Warm-up of the amplifier’s valves',
    default: 20,
    min: 0,
    max: 600,
    plausible: { min: 5, max: 120 },
    help: 'Until they draw their working current.',
  }),
  rectifierWarmUp: quantity('s', {
    label: 'Warm-up of a valve rectifier',
    default: 10,
    min: 0,
    max: 600,
    plausible: { min: 0, max: 60 },
    help: 'Directly heated ones conduct within a few seconds; indirectly heated ones take longer.',
  }),
};

const { schema: baseSchema, fields } = defineInputs(shape);
export type RectifierSubstitutionInput = InputOf<typeof shape>;

const inputs = baseSchema.superRefine((v, ctx) => {
  if (v.from === 'valve' && v.fromValveDrop === undefined)
    ctx.addIssue({ code: 'custom', path: ['fromValveDrop'], message: 'is required for a valve rectifier' });
  if (v.to === 'valve' && v.toValveDrop === undefined)
    ctx.addIssue({ code: 'custom', path: ['toValveDrop'], message: 'is required for a valve rectifier' });
});

/** Silicon diodes in the conducting path: one for a centre tap, two for a bridge. */
const diodesConducting = (circuit: RectifierSubstitutionInput['circuit']) => (circuit === 'bridge' ? 2 : 1);

/**
 * Peak inverse voltage on each diode: 2√2 V_rms (V_rms per half) for a centre tap, √2 V_rms for a
 * bridge [derived; docs/references.md §2].
 */
export function peakInverse(circuit: RectifierSubstitutionInput['circuit'], vRms: number): number {
  return (circuit === 'bridge' ? 1 : 2) * Math.SQRT2 * vRms;
}

function dropOf(input: RectifierSubstitutionInput, which: 'from' | 'to'): number {
  if (input[which] === 'silicon') return diodesConducting(input.circuit) * input.diodeDrop;
  return (which === 'from' ? input.fromValveDrop : input.toValveDrop) ?? 0;
}

function compute(input: RectifierSubstitutionInput): ReckonerResult {
  const change = dropOf(input, 'from') - dropOf(input, 'to');
  const I = input.loadCurrent;
  const high = 1 + input.highMains / 100;
  const vPeakHigh = Math.SQRT2 * input.windingVoltage * high;
  const outputs: ReckonerResult['outputs'] = {
    bplusChange: q(
      change,
      'V dc',
      'Change in B+ at every node',
      `The fitted rectifier’s drop (${formatQuantity(dropOf(input, 'from'), 'V')}) less the new one’s (${formatQuantity(dropOf(input, 'to'), 'V')}), at the same currents.`,
      SRC.derived,
    ),
    noLoadPeakHigh: q(
      vPeakHigh - dropOf(input, 'to'),
      'V dc',
      'No-load peak at high mains',
      `√2 × the winding at +${input.highMains} % mains, less the new rectifier’s drop.`,
      SRC.derived,
    ),
  };
  input.nodes.forEach((node, i) => {
    outputs[`node${i + 1}.voltage`] = q(
      node.volts + change,
      'V dc',
      `${node.label ?? `Node ${i + 1}`}: with the new rectifier`,
      'The fitted figure plus the change in drop.',
      SRC.derived,
    );
  });
  if (change > 0) {
    const exact = change / I;
    const r = nearestESeries(exact, 'E12');
    const p = I * I * r;
    outputs.seriesResistanceExact = q(
      exact,
      'Ω',
      'Series resistance to restore B+',
      'The rise ÷ the load current, for a resistor after the reservoir (with its own capacitor after it, as a first dropper stage), where it carries the steady load current. Placed between the rectifier and the reservoir it would carry the charging peaks and drop far more: work that position out with the loaded-B+ block and its source resistance.',
      SRC.derived,
    );
    outputs.seriesResistance = q(
      r,
      'Ω',
      'Series resistor (nearest E12)',
      'Nearest E12 value.',
      'IEC 60063 E12',
    );
    outputs.seriesDissipation = q(p, 'W', 'Series resistor dissipation', 'I² × R.', SRC.derived);
    outputs.seriesRating = q(
      suggestedPowerRating(p),
      'W',
      'Series resistor rating',
      `Next common rating at or above ${RESISTOR_DERATING} × the dissipation.`,
      SRC.commonPractice,
    );
  }
  if (input.to === 'silicon') {
    outputs.diodePiv = q(
      peakInverse(input.circuit, input.windingVoltage * high),
      'V peak',
      'Peak inverse voltage per diode at high mains',
      input.circuit === 'bridge' ? '√2 × the winding.' : '2√2 × the half-winding: the other half adds to it.',
      SRC.derived,
    );
    outputs.timeAtNoLoad = q(
      input.outputWarmUp,
      's',
      'Time the filter sits at the no-load peak',
      'Silicon conducts at once; until the valves warm up nothing draws current.',
      SRC.derived,
    );
  } else {
    outputs.timeAtNoLoad = q(
      Math.max(0, input.outputWarmUp - input.rectifierWarmUp),
      's',
      'Time the filter sits at the no-load peak',
      'The amplifier’s warm-up less the valve rectifier’s.',
      SRC.derived,
    );
  }
  outputs.summary = s(
    `${RECTIFIERS.find((r) => r.value === input.from)!.label} → ${RECTIFIERS.find((r) => r.value === input.to)!.label.toLowerCase()}`,
    'Substitution',
    'As entered.',
  );
  return { outputs };
}

/** Margin of a diode's repetitive reverse rating over the highest peak inverse voltage (common practice, no source). */
export const PIV_MARGIN = 1.2;

function cautions(input: RectifierSubstitutionInput, result: ReckonerResult): Caution[] {
  const o = result.outputs;
  const peak = Number(o.noLoadPeakHigh!.value);
  const piv = o.diodePiv ? Number(o.diodePiv.value) : undefined;
  const soak = Number(o.timeAtNoLoad!.value);
  return compact([
    hazardousVoltage(peak, 'At high mains with no load the reservoir'),
    piv !== undefined &&
      input.diodePiv !== undefined &&
      input.diodePiv < PIV_MARGIN * piv && {
        level: 'warning',
        code: 'diode-piv',
        field: 'diodePiv',
        message: `The diodes see up to ${formatQuantity(piv, 'V')} in reverse at high mains; a ${formatQuantity(input.diodePiv, 'V')} rating leaves less than a ${PIV_MARGIN}× margin. Use a higher rating or diodes in series.`,
        source: SRC.commonPractice,
      },
    soak > 0 && {
      level: 'warning',
      code: 'no-load-soak',
      message: `For about ${formatQuantity(soak, 's')} after switch-on every filter capacitor sits near ${formatQuantity(peak, 'V')} at high mains: rate them for it.`,
    },
    LOCAL_CODES,
  ]);
}

export const rectifierSubstitution: ReckonerDefinition<RectifierSubstitutionInput> = {
  kind: 'rectifier-substitution',
  label: 'Rectifier substitution',
  summary:
    'Valve ↔ silicon: the change in B+ at each node, the series resistor that restores it, the diodes’ peak inverse voltage at high mains and the time at the no-load peak.',
  inputs,
  fields,
  compute,
  cautions,
  keyOutputs: ['bplusChange', 'seriesResistance', 'diodePiv', 'timeAtNoLoad'],
  noLoadOutputs: ['noLoadPeakHigh'],
};
