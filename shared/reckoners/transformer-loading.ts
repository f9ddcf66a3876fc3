/**
 * Transformer loading: VA per winding and in total against the ratings, and the regulation worked
 * from winding resistances measured at the bench — which also gives the source resistance a loaded
 * B+ block should use instead of a typed guess.
 */
import { formatNumber, formatQuantity } from '../units/format';
import { compact, LOCAL_CODES } from './cautions';
import { defineInputs, optionalQuantity, quantity, rows, text, type InputOf } from './fields';
import { n, q, SRC } from './outputs';
import { sourceResistance } from './switch-on-surge';
import type { Caution, ReckonerDefinition, ReckonerResult } from './types';

const shape = {
  mainsVoltage: quantity('V rms', {
    label: 'Primary voltage',
    default: 230,
    min: 50,
    max: 300,
    plausible: { min: 90, max: 260 },
    follows: 'mainsNominal',
    part: 'mains-nominal',
  }),
  primaryResistance: optionalQuantity('Ω', {
    label: 'Primary winding resistance',
    min: 0,
    max: 10_000,
    plausible: { min: 0.1, max: 500 },
    help: 'Measured unpowered, mains disconnected.',
  }),
  efficiency: quantity('%', {
    label: 'Transformer efficiency',
    default: 85,
    min: 30,
    max: 100,
    plausible: { min: 60, max: 98 },
    part: 'transformer-efficiency',
  }),
  ratedVA: optionalQuantity('VA', {
    label: 'Transformer rating',
    min: 1e-3,
    max: 10_000,
    plausible: { min: 1, max: 2000 },
  }),
  windings: rows(
    {
      label: text({ label: 'Winding' }),
      volts: quantity('V rms', {
        label: 'Rated voltage',
        min: 1e-3,
        max: 5000,
        plausible: { min: 1, max: 1500 },
      }),
      amps: quantity('A rms', {
        label: 'Load current (AC rms)',
        min: 0,
        max: 100,
        plausible: { min: 0, max: 20 },
      }),
      ratedAmps: optionalQuantity('A rms', {
        label: 'Rated current',
        min: 1e-6,
        max: 100,
        plausible: { min: 5e-3, max: 20 },
      }),
      resistance: optionalQuantity('Ω', {
        label: 'Measured resistance',
        min: 0,
        max: 10_000,
        plausible: { min: 0, max: 1000 },
        help: 'Unpowered, with an ohmmeter; one half of a centre-tapped winding.',
      }),
    },
    { label: 'Secondary windings', minRows: 1, maxRows: 12 },
  ),
};

const { schema: inputs, fields } = defineInputs(shape);
export type TransformerLoadingInput = InputOf<typeof shape>;

function compute(input: TransformerLoadingInput): ReckonerResult {
  const outputs: ReckonerResult['outputs'] = {};
  const totalVA = input.windings.reduce((sum, w) => sum + w.volts * w.amps, 0);
  const primaryCurrent = totalVA / ((input.efficiency / 100) * input.mainsVoltage);
  // The primary's own drop lowers every secondary by the same fraction.
  const primaryDropFraction =
    input.primaryResistance !== undefined
      ? (primaryCurrent * input.primaryResistance) / input.mainsVoltage
      : 0;
  outputs.totalVA = q(totalVA, 'VA', 'Total secondary load', 'Σ V × I over the windings.', SRC.derived);
  outputs.primaryCurrent = q(
    primaryCurrent,
    'A rms',
    'Primary current',
    `Total load ÷ (${formatNumber(input.efficiency)} % × ${formatQuantity(input.mainsVoltage, 'V')}).`,
    SRC.derived,
  );
  if (input.ratedVA !== undefined)
    outputs.loading = n(
      (100 * totalVA) / input.ratedVA,
      'Load, % of the transformer rating',
      'Total load ÷ rating.',
      SRC.derived,
    );
  input.windings.forEach((w, i) => {
    const key = `winding${i + 1}`;
    const name = w.label ?? `Winding ${i + 1}`;
    outputs[`${key}.va`] = q(w.volts * w.amps, 'VA', `${name}: load`, 'V × I.', SRC.derived);
    if (w.ratedAmps !== undefined)
      outputs[`${key}.loading`] = n(
        (100 * w.amps) / w.ratedAmps,
        `${name}: load, % of rated current`,
        'Load current ÷ rated current.',
        SRC.derived,
      );
    if (w.resistance !== undefined) {
      const ratio = w.volts / input.mainsVoltage;
      const rs = sourceResistance(w.resistance, input.primaryResistance ?? 0, ratio);
      const secondaryDrop = w.amps * w.resistance + w.volts * primaryDropFraction;
      outputs[`${key}.regulation`] = n(
        (100 * secondaryDrop) / w.volts,
        `${name}: regulation, %`,
        'Its own I × R plus the primary’s share, as a fraction of the rated voltage; measured winding resistances.',
        SRC.derived,
      );
      outputs[`${key}.loadedVoltage`] = q(
        w.volts - secondaryDrop,
        'V rms',
        `${name}: voltage under this load`,
        'Rated (open-circuit) voltage less the drop, taking the rating as the open-circuit figure.',
        SRC.derived,
      );
      outputs[`${key}.sourceResistance`] = q(
        rs,
        'Ω',
        `${name}: source resistance`,
        'R_winding + R_primary × (V_winding ÷ V_primary)²: the figure for a loaded-B+ block fed from this winding.',
        SRC.derived,
      );
    }
  });
  return { outputs };
}

function cautions(input: TransformerLoadingInput, result: ReckonerResult): Caution[] {
  const loading = result.outputs.loading ? Number(result.outputs.loading.value) : undefined;
  return compact([
    loading !== undefined &&
      loading > 100 && {
        level: 'warning',
        code: 'transformer-overloaded',
        field: 'ratedVA',
        message: `The windings draw ${formatNumber(loading, 3)} % of the transformer’s rating: it will run hot and its voltages sag.`,
      },
    ...input.windings.map((w, i): Caution | null =>
      w.ratedAmps !== undefined && w.amps > w.ratedAmps
        ? {
            level: 'warning',
            code: 'winding-overloaded',
            field: `windings.${i}.amps`,
            message: `${w.label ?? `Winding ${i + 1}`} carries ${formatQuantity(w.amps, 'A')}, above its ${formatQuantity(w.ratedAmps, 'A')} rating.`,
          }
        : null,
    ),
    LOCAL_CODES,
  ]);
}

export const transformerLoading: ReckonerDefinition<TransformerLoadingInput> = {
  kind: 'transformer-loading',
  label: 'Transformer loading',
  summary:
    'VA per winding and in total against the ratings, regulation from measured winding resistances, and the source resistance for a loaded-B+ block.',
  inputs,
  fields,
  compute,
  cautions,
  keyOutputs: ['totalVA', 'loading', 'regulation', 'sourceResistance'],
};
