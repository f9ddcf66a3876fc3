/**
 * Peak and no-load DC: the winding scaled to the actual mains, its peak √2·Vrms, and the DC the
 * reservoir charges to with no load — the highest voltage the filter capacitors will see.
 */
import { formatNumber, formatQuantity } from '../units/format';
import { compact, hazardousVoltage, LOCAL_CODES } from './cautions';
import { defineInputs, optionalInteger, optionalQuantity, quantity, select, type InputOf } from './fields';
import { ReckonerInputError } from './errors';
import { b, n, q, SRC } from './outputs';
import { diodeDropField, diodesInPath, rectifierField, requireValveDrop, valveDropField } from './rectifier';
import type { Caution, ReckonerDefinition, ReckonerResult } from './types';

const shape = {
  windingVoltage: quantity('V rms', {
    label: 'Winding voltage (rms)',
    min: 1e-3,
    max: 3000,
    plausible: { min: 2, max: 1500 },
    help: 'The rated (nominal) figure, or one measured unloaded at the bench.',
  }),
  windingBasis: select({
    label: 'Winding figure is',
    options: [
      { value: 'nominal', label: 'Rated, at nominal mains and full load' },
      { value: 'measured', label: 'Measured unloaded, at the actual mains' },
    ],
    default: 'nominal',
  }),
  mainsNominal: quantity('V rms', {
    label: 'Nominal mains',
    default: 230,
    min: 50,
    max: 300,
    plausible: { min: 90, max: 260 },
    follows: 'mainsNominal',
    part: 'mains-nominal',
  }),
  mainsActual: optionalQuantity('V rms', {
    label: 'Actual mains',
    min: 50,
    max: 300,
    plausible: { min: 80, max: 280 },
    follows: 'mainsVoltage',
    help: 'Follows the measured mains of the procedure (and of each bench run). A winding scales with the mains.',
  }),
  rectifier: rectifierField(),
  diodeDrop: diodeDropField(),
  valveDrop: valveDropField(
    'The author’s figure for the valve rectifier’s drop; required for a valve rectifier.',
  ),
  unloadedRise: quantity('%', {
    label: 'Unloaded rise of a rated winding',
    default: 10,
    min: 0,
    max: 50,
    plausible: { min: 0, max: 25 },
    help: 'Small transformers read 5–10 % above rating unloaded (common practice).',
  }),
  filterNodes: optionalInteger({ label: 'DC filter nodes', min: 1, max: 10 }),
};

const { schema: baseSchema, fields } = defineInputs(shape);
export type PeakNoLoadInput = InputOf<typeof shape>;

const inputs = baseSchema.superRefine((v, ctx) => {
  requireValveDrop(v, ctx);
});

export const SQRT2 = Math.SQRT2;

/** V_actual = V_rated × (V_mains_actual / V_mains_nominal) [derived]. */
export function scaleWithMains(vRated: number, mainsActual: number, mainsNominal: number): number {
  return (vRated * mainsActual) / mainsNominal;
}

export function rectifierDrop(input: Pick<PeakNoLoadInput, 'rectifier' | 'diodeDrop' | 'valveDrop'>): number {
  return input.rectifier === 'valve'
    ? (input.valveDrop ?? 0)
    : diodesInPath(input.rectifier) * input.diodeDrop;
}

function compute(input: PeakNoLoadInput): ReckonerResult {
  const actual = input.mainsActual ?? input.mainsNominal;
  const measured = input.windingBasis === 'measured';
  const vWinding = measured
    ? input.windingVoltage
    : scaleWithMains(input.windingVoltage, actual, input.mainsNominal);
  const vPeak = SQRT2 * vWinding;
  const drop = rectifierDrop(input);
  // No silent zero: a peak at or below the rectifier drop is a slipped unit or a wrong rectifier.
  if (vPeak <= drop) {
    throw new ReckonerInputError(
      'windingVoltage',
      `gives a peak of ${formatQuantity(vPeak, 'V')}, no more than the rectifier drop of ${formatQuantity(drop, 'V')}: the supply would give no DC — check the value and its unit`,
    );
  }
  const noLoadDc = vPeak - drop;
  // A rated winding reads high when unloaded; the top of the band gives the capacitor-rating figure.
  const bandLow = vWinding;
  const bandHigh = measured ? vWinding : vWinding * (1 + input.unloadedRise / 100);
  const noLoadHigh = SQRT2 * bandHigh - drop;

  const dropText =
    input.rectifier === 'valve'
      ? `minus the valve rectifier drop of ${formatQuantity(drop, 'V')} as entered (at no load the real drop is smaller, so expect up to the peak)`
      : `minus ${diodesInPath(input.rectifier)} × ${formatQuantity(input.diodeDrop, 'V')} silicon diode drop`;

  const outputs: ReckonerResult['outputs'] = {
    windingVoltage: q(
      vWinding,
      'V rms',
      'Winding voltage at this mains',
      measured
        ? 'As measured.'
        : `Rated figure × ${formatQuantity(actual, 'V')} ÷ ${formatQuantity(input.mainsNominal, 'V')}.`,
      SRC.derived,
    ),
    peakVoltage: q(
      vPeak,
      'V peak',
      'Peak voltage',
      '√2 × rms winding voltage.',
      'derived; any circuit-theory text',
    ),
    noLoadDc: q(
      noLoadDc,
      'V dc',
      'No-load DC at the reservoir',
      `Capacitor-input: the peak ${dropText}.`,
      SRC.commonPractice,
    ),
    windingUnloadedLow: q(
      bandLow,
      'V rms',
      'Unloaded winding check, low',
      'Lowest expected unloaded reading.',
      SRC.commonPractice,
    ),
    windingUnloadedHigh: q(
      bandHigh,
      'V rms',
      'Unloaded winding check, high',
      measured
        ? 'As measured.'
        : `Rated figure at this mains plus ${formatNumber(input.unloadedRise)} % unloaded rise.`,
      SRC.commonPractice,
    ),
    noLoadDcHigh: q(
      noLoadHigh,
      'V dc',
      'No-load DC, high end',
      'Peak of the high unloaded winding figure less the rectifier drop: rate every filter capacitor for at least this.',
      SRC.commonPractice,
    ),
    mainsRatio: n(actual / input.mainsNominal, 'Mains ratio', 'Actual ÷ nominal mains.', SRC.derived, 4),
    scaled: b(
      !measured && actual !== input.mainsNominal,
      'Scaled to actual mains',
      'Whether the winding figure was scaled.',
    ),
  };
  if (input.filterNodes !== undefined) {
    outputs.filterNodes = n(
      input.filterNodes,
      'Filter nodes at the no-load figure',
      'With no current drawn there is no drop across the dropping resistors: every filter node sits near the no-load DC.',
      SRC.derived,
    );
  }
  return { outputs };
}

function cautions(input: PeakNoLoadInput, result: ReckonerResult): Caution[] {
  const high = Number(result.outputs.noLoadDcHigh!.value);
  const nodes = input.filterNodes;
  return compact([
    hazardousVoltage(high, nodes ? `Every one of the ${nodes} filter nodes` : 'The reservoir node'),
    high > 60 && {
      level: 'warning',
      code: 'capacitor-rating',
      message: `Before the valves warm up, B+ sits near the no-load figure (up to about ${formatQuantity(high, 'V')}, more at high mains). Rate every filter capacitor for it.`,
    },
    LOCAL_CODES,
  ]);
}

export const peakNoLoad: ReckonerDefinition<PeakNoLoadInput> = {
  kind: 'peak-no-load',
  label: 'Peak and no-load DC',
  summary: 'Winding at the actual mains, its peak, and the DC the reservoir reaches with no load.',
  inputs,
  fields,
  compute,
  cautions,
  keyOutputs: ['windingVoltage', 'peakVoltage', 'noLoadDc', 'noLoadDcHigh'],
  noLoadOutputs: ['noLoadDc', 'noLoadDcHigh'],
};
