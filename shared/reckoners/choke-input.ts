/**
 * Choke-input filter: a full-wave rectifier feeding an inductor first. Once the choke conducts
 * all the time, the DC is the average of the rectified wave (2√2/π ≈ 0.9 × rms) less the drops,
 * nearly independent of load; below the critical current the output rises toward the peak.
 */
import { floorESeries } from '../standards/eSeries';
import { RESISTOR_DERATING } from '../standards/thresholds';
import { formatQuantity } from '../units/format';
import { compact, hazardousVoltage, LOCAL_CODES, resonanceNearRipple } from './cautions';
import { lcResonance, suggestedPowerRating } from './dropper-ladder';
import { ReckonerInputError } from './errors';
import { defineInputs, optionalQuantity, quantity, type InputOf } from './fields';
import { n, q, SRC } from './outputs';
import { rectifierDrop } from './peak-no-load';
import { diodeDropField, rectifierField, requireValveDrop, valveDropField } from './rectifier';
import type { Caution, ReckonerDefinition, ReckonerResult } from './types';

const shape = {
  windingVoltage: quantity('V rms', {
    label: 'Winding voltage (rms)',
    min: 1e-3,
    max: 3000,
    plausible: { min: 2, max: 1500 },
    help: 'For a centre-tapped winding, one half (e.g. 350 V for 350-0-350).',
  }),
  rectifier: rectifierField(),
  diodeDrop: diodeDropField(),
  valveDrop: valveDropField(
    'The drop at the load current, from the valve’s data sheet; required for a valve rectifier.',
  ),
  windingResistance: quantity('Ω', {
    label: 'Winding resistance',
    default: 0,
    min: 0,
    max: 10_000,
    plausible: { min: 0, max: 1000 },
    help: 'Secondary (one half for a centre tap) plus the primary reflected by the turns ratio squared.',
  }),
  chokeInductance: quantity('H', {
    label: 'Choke inductance',
    min: 1e-3,
    max: 500,
    plausible: { min: 0.5, max: 50 },
    part: 'input-choke',
    help: 'At the lightest load: a swinging choke’s higher figure.',
  }),
  chokeResistance: quantity('Ω', {
    label: 'Choke DC resistance',
    min: 0,
    max: 10_000,
    plausible: { min: 1, max: 1000 },
  }),
  loadCurrent: quantity('A dc', {
    label: 'Load current (DC)',
    min: 1e-6,
    max: 10,
    plausible: { min: 1e-3, max: 3 },
  }),
  lightestLoad: optionalQuantity('A dc', {
    label: 'Lightest load current (DC)',
    min: 0,
    max: 10,
    plausible: { min: 0, max: 3 },
    help: 'What is drawn with the valves cold or the output idle, bleeder included.',
  }),
  mainsFrequency: quantity('Hz', {
    label: 'Mains frequency',
    default: 50,
    min: 16,
    max: 440,
    plausible: { min: 45, max: 65 },
    follows: 'mainsFrequency',
  }),
  filterCapacitance: optionalQuantity('F', {
    label: 'Capacitor after the choke',
    min: 1e-9,
    max: 1,
    plausible: { min: 1e-6, max: 0.01 },
    help: 'Leave empty to skip the ripple and resonance figures.',
  }),
};

const { schema: baseSchema, fields } = defineInputs(shape);
export type ChokeInputInput = InputOf<typeof shape>;

const inputs = baseSchema.superRefine((v, ctx) => {
  requireValveDrop(v, ctx);
  if (v.lightestLoad !== undefined && v.lightestLoad > v.loadCurrent) {
    ctx.addIssue({
      code: 'custom',
      path: ['lightestLoad'],
      message: 'must not exceed the load current',
    });
  }
});

/** Average of a full-wave rectified sine over its rms: 2√2/π [derived; docs/references.md §3]. */
export const CHOKE_INPUT_RATIO = (2 * Math.SQRT2) / Math.PI;

/**
 * Critical inductance for a full-wave choke input: L = R_L / (3ω), ω = 2π × mains frequency
 * [derived from the first two Fourier terms; docs/references.md §3].
 */
export function criticalInductance(loadResistance: number, mainsFrequency: number): number {
  return loadResistance / (3 * 2 * Math.PI * mainsFrequency);
}

/** Amplitude of the 2f term of a full-wave rectified sine: 4 V_pk / (3π) [derived; §3]. */
export function secondHarmonicPeak(vPeak: number): number {
  return (4 * vPeak) / (3 * Math.PI);
}

function compute(input: ChokeInputInput): ReckonerResult {
  const f = input.mainsFrequency;
  const w = 2 * Math.PI * f;
  const vPeak = Math.SQRT2 * input.windingVoltage;
  const drop = rectifierDrop(input);
  const average = CHOKE_INPUT_RATIO * input.windingVoltage;
  const I = input.loadCurrent;
  const seriesR = input.chokeResistance + input.windingResistance;
  const dc = average - drop - I * seriesR;
  if (dc <= 0) {
    throw new ReckonerInputError(
      'loadCurrent',
      `leaves no DC: the rectified average of ${formatQuantity(average, 'V')} is used up by the rectifier and resistance drops — check the values and their units`,
    );
  }
  const loadR = dc / I;
  // Largest load resistance (smallest current) this choke keeps in conduction: R = 3ωL.
  const rMax = 3 * w * input.chokeInductance;
  const minCurrent = dc / rMax;

  const outputs: ReckonerResult['outputs'] = {
    rectifiedAverage: q(
      average,
      'V dc',
      'Average of the rectified winding',
      '2√2 ÷ π ≈ 0.900 × the rms winding voltage.',
      SRC.derived,
    ),
    dcOutput: q(
      dc,
      'V dc',
      'DC output at the load current',
      `The average less the rectifier drop of ${formatQuantity(drop, 'V')} and ${formatQuantity(I, 'A')} × ${formatQuantity(seriesR, 'Ω')} of choke and winding resistance.`,
      SRC.derived,
    ),
    chokeDrop: q(I * input.chokeResistance, 'V dc', 'Drop across the choke', 'I × R_choke.', SRC.derived),
    chokeDissipation: q(
      I * I * input.chokeResistance,
      'W',
      'Choke dissipation',
      'I² × R_choke.',
      SRC.derived,
    ),
    rippleFrequency: q(2 * f, 'Hz', 'Ripple frequency', 'Twice the mains, full-wave.', SRC.derived),
    criticalInductance: q(
      criticalInductance(loadR, f),
      'H',
      'Critical inductance at the load current',
      `R_L ÷ (3ω) with R_L = ${formatQuantity(loadR, 'Ω')}.`,
      SRC.derived,
    ),
    minimumCurrent: q(
      minCurrent,
      'A dc',
      'Least current that keeps this choke conducting',
      `DC output ÷ 3ωL (3ωL = ${formatQuantity(rMax, 'Ω')}).`,
      SRC.derived,
    ),
    noLoadPeak: q(
      vPeak - drop,
      'V dc',
      'Output with no load',
      'With no current the choke does not conduct continuously and the capacitor charges to the peak less the rectifier drop.',
      SRC.derived,
    ),
  };

  const light = input.lightestLoad;
  if (light !== undefined) {
    outputs.criticalInductanceLight = q(
      light > 0 ? criticalInductance(dc / light, f) : Number.MAX_VALUE,
      'H',
      'Critical inductance at the lightest load',
      'R_L ÷ (3ω) at the lightest load.',
      SRC.derived,
    );
  }
  // A bleeder that makes up the shortfall between the lightest load (or nothing) and the minimum.
  const shortfall = minCurrent - (light ?? 0);
  if (shortfall > 0) {
    const rExact = dc / shortfall;
    const r = floorESeries(rExact, 'E12');
    const p = (dc * dc) / r;
    outputs.bleederExact = q(
      rExact,
      'Ω',
      'Largest bleeder that holds conduction',
      light === undefined
        ? 'DC output ÷ the least current, with nothing else drawing.'
        : 'DC output ÷ (least current − lightest load).',
      SRC.derived,
    );
    outputs.suggestedBleeder = q(
      r,
      'Ω',
      'Suggested bleeder (E12, at or below)',
      'E12 at or below.',
      'IEC 60063 E12',
    );
    outputs.suggestedBleederRating = q(
      suggestedPowerRating(p),
      'W',
      'Suggested bleeder rating',
      `Next common rating at or above ${RESISTOR_DERATING} × ${formatQuantity(p, 'W')}.`,
      SRC.commonPractice,
    );
  }

  const C = input.filterCapacitance;
  if (C !== undefined) {
    const wr = 2 * w;
    const attenuation = 1 / Math.abs(1 - wr * wr * input.chokeInductance * C);
    const ripplePeak = secondHarmonicPeak(vPeak) * attenuation;
    outputs.resonance = q(
      lcResonance(input.chokeInductance, C),
      'Hz',
      'LC resonance',
      '1 ÷ (2π √(L C)).',
      SRC.derived,
    );
    outputs.rippleRms = q(
      ripplePeak / Math.SQRT2,
      'V rms',
      'Ripple at the output, rms',
      `The 2f term of the rectified wave (4 V_pk ÷ 3π) divided by |1 − ω_r² L C| = ${attenuation.toPrecision(3)}; higher terms are smaller.`,
      SRC.derived,
    );
    outputs.ripplePercent = n(
      (100 * ripplePeak) / Math.SQRT2 / dc,
      'Ripple, % of DC (rms)',
      'Ripple rms ÷ DC output.',
      SRC.derived,
    );
  }
  return { outputs };
}

function cautions(input: ChokeInputInput, result: ReckonerResult): Caution[] {
  const o = result.outputs;
  const peak = Number(o.noLoadPeak!.value);
  const minCurrent = Number(o.minimumCurrent!.value);
  const resonance = o.resonance ? Number(o.resonance.value) : undefined;
  const rippleF = 2 * input.mainsFrequency;
  return compact([
    hazardousVoltage(peak, 'With no load the output'),
    input.loadCurrent < minCurrent && {
      level: 'warning',
      code: 'below-critical',
      field: 'chokeInductance',
      message: `At ${formatQuantity(input.loadCurrent, 'A')} the choke does not conduct all the time (it needs at least ${formatQuantity(minCurrent, 'A')}): the output rises from the 0.9 × rms figure toward the peak of ${formatQuantity(peak, 'V')}. Use a larger choke or a bleeder.`,
    },
    input.loadCurrent >= minCurrent &&
      (input.lightestLoad ?? 0) < minCurrent && {
        level: 'warning',
        code: 'light-load-soars',
        field: 'lightestLoad',
        message: `Below ${formatQuantity(minCurrent, 'A')} (valves cold, output idle) the output soars toward the peak of ${formatQuantity(peak, 'V')}. A bleeder drawing the difference keeps it in conduction; rate the capacitors for the peak.`,
      },
    resonance !== undefined && resonanceNearRipple(resonance, rippleF, 'filterCapacitance'),
    LOCAL_CODES,
  ]);
}

export const chokeInput: ReckonerDefinition<ChokeInputInput> = {
  kind: 'choke-input',
  label: 'Choke-input filter',
  summary:
    'DC output of a choke-input supply, the critical inductance, the least load that keeps the choke conducting, and the ripple after the first capacitor.',
  inputs,
  fields,
  compute,
  cautions,
  keyOutputs: ['dcOutput', 'criticalInductance', 'minimumCurrent', 'suggestedBleeder'],
  noLoadOutputs: ['noLoadPeak'],
};
