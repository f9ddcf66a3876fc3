/**
 * Loaded B+ behind a capacitor-input filter, solved numerically (see capacitor-input.ts):
 * average DC, ripple, peak rectifier current and the reservoir's ripple current.
 */
import { formatQuantity } from '../units/format';
import { compact, hazardousVoltage, LOCAL_CODES, storedEnergy } from './cautions';
import { simulateCapacitorInput, CapInputOverload, type CapInputParams } from './capacitor-input';
import { ReckonerInputError } from './errors';
import { defineInputs, optionalQuantity, quantity, type InputOf } from './fields';
import { n, q, SRC } from './outputs';
import { diodeDropField, diodesInPath, rectifierField } from './rectifier';
import type { Caution, ReckonerDefinition, ReckonerResult } from './types';

const shape = {
  windingVoltage: quantity('V rms', {
    label: 'Winding voltage (rms, unloaded)',
    min: 1e-3,
    max: 3000,
    plausible: { min: 2, max: 1500 },
    help: 'The open-circuit figure; the winding’s resistance goes in source resistance. Half of a centre-tapped winding.',
  }),
  sourceResistance: quantity('Ω', {
    label: 'Source resistance',
    min: 1e-3,
    max: 1e5,
    plausible: { min: 1, max: 5e3 },
    help: 'Secondary resistance plus the primary’s reflected by the turns ratio squared, plus the rectifier’s resistance.',
  }),
  reservoir: quantity('F', {
    label: 'Reservoir capacitance',
    min: 1e-12,
    max: 0.1,
    plausible: { min: 1e-6, max: 0.02 },
    part: 'reservoir-capacitance',
  }),
  reservoirRating: optionalQuantity('V dc', {
    label: 'Reservoir voltage rating',
    min: 1,
    max: 5000,
    plausible: { min: 6, max: 1000 },
    rating: 'capacitor-voltage',
    help: 'The capacitor’s marked working voltage; the procedure check compares it with the no-load peak at high mains.',
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
    plausible: { min: 1e-4, max: 3 },
  }),
  rectifier: rectifierField(),
  diodeDrop: diodeDropField(),
  valveDrop: quantity('V dc', {
    label: 'Valve rectifier fixed drop',
    default: 0,
    min: 0,
    max: 200,
    plausible: { min: 0, max: 100 },
    part: 'valve-rectifier-drop',
    help: 'A valve’s drop grows with current: model it mainly as resistance in source resistance; put only a fixed part here.',
  }),
};

const { schema: inputs, fields } = defineInputs(shape);
export type LoadedBplusInput = InputOf<typeof shape>;

/** The circuit the solver is given for a block's inputs (the ripple plot draws the same one). */
export function loadedBplusCircuit(input: LoadedBplusInput): CapInputParams {
  return {
    vPeak: Math.SQRT2 * input.windingVoltage,
    drop: input.rectifier === 'valve' ? input.valveDrop : diodesInPath(input.rectifier) * input.diodeDrop,
    rSource: input.sourceResistance,
    capacitance: input.reservoir,
    frequency: input.mainsFrequency,
    loadCurrent: input.loadCurrent,
  };
}

function compute(input: LoadedBplusInput): ReckonerResult {
  const circuit = loadedBplusCircuit(input);
  const { drop, vPeak } = circuit;
  if (vPeak <= drop)
    throw new ReckonerInputError(
      'windingVoltage',
      `peak ${formatQuantity(vPeak, 'V')} does not exceed the rectifier drop`,
    );
  let r;
  try {
    r = simulateCapacitorInput(circuit);
  } catch (e) {
    if (e instanceof CapInputOverload)
      throw new ReckonerInputError(
        'loadCurrent',
        `too high for this winding, source resistance and reservoir: ${e.message}`,
      );
    throw e;
  }
  // Bridge: the winding carries the rectifier current every half-cycle. Centre-tap (silicon or
  // valve): each half of the winding, and each rectifier, carries it on alternate half-cycles.
  const windingRms =
    input.rectifier === 'silicon-bridge' ? r.rectifierRmsHalfCycle : r.rectifierRmsHalfCycle / Math.SQRT2;
  const diodeRms = r.rectifierRmsHalfCycle / Math.SQRT2;
  const model = 'Time-step solution of the full-wave rectifier charging the reservoir, at steady state.';
  const outputs: ReckonerResult['outputs'] = {
    averageDc: q(
      r.averageDc,
      'V dc',
      'Loaded B+ (average DC)',
      `${model} Constant-current load.`,
      SRC.derived,
    ),
    ripplePeakToPeak: q(
      r.ripplePeakToPeak,
      'V peak-to-peak',
      'Ripple, peak to peak',
      `${model} At ${formatQuantity(2 * input.mainsFrequency, 'Hz')}.`,
      SRC.derived,
    ),
    rippleRms: q(r.rippleRms, 'V rms', 'Ripple, rms', model, SRC.derived),
    maximumDc: q(r.maximum, 'V peak', 'Reservoir voltage, crest', model, SRC.derived),
    minimumDc: q(r.minimum, 'V dc', 'Reservoir voltage, trough', model, SRC.derived),
    peakRectifierCurrent: q(
      r.peakRectifierCurrent,
      'A peak',
      'Peak repetitive rectifier current',
      model,
      SRC.derived,
    ),
    rectifierRmsCurrent: q(diodeRms, 'A rms', 'Rectifier rms current (each)', model, SRC.derived),
    windingRmsCurrent: q(
      windingRms,
      'A rms',
      'Winding rms current',
      `${model} Use this as the winding’s current in the mains-fuse reckoner${input.rectifier === 'silicon-bridge' ? '' : ' (per half of the winding)'}.`,
      SRC.derived,
    ),
    capacitorRippleCurrent: q(
      r.capacitorRmsCurrent,
      'A rms',
      'Reservoir ripple current (rms)',
      model,
      SRC.derived,
    ),
    conduction: q(r.conductionFraction * 100, '%', 'Conduction per half-cycle', model, SRC.derived),
    peakVoltage: q(vPeak, 'V peak', 'Winding peak', '√2 × rms winding voltage.', SRC.derived),
    noLoadDc: q(
      vPeak - drop,
      'V dc',
      'No-load DC',
      'Peak less the rectifier drop: the reservoir reaches this before the valves draw current.',
      SRC.commonPractice,
    ),
    regulation: n(
      ((vPeak - drop - r.averageDc) / r.averageDc) * 100,
      'Regulation, no-load to this load (%)',
      '(no-load − loaded) ÷ loaded × 100.',
      SRC.derived,
    ),
  };
  return { outputs };
}

function cautions(input: LoadedBplusInput, result: ReckonerResult): Caution[] {
  const noLoad = Number(result.outputs.noLoadDc!.value);
  const peakI = Number(result.outputs.peakRectifierCurrent!.value);
  const ripple = Number(result.outputs.capacitorRippleCurrent!.value);
  return compact([
    hazardousVoltage(noLoad, 'B+ at the reservoir'),
    storedEnergy(input.reservoir, noLoad, 'The reservoir capacitor'),
    {
      level: 'warning',
      code: 'ripple-current',
      message: `The reservoir carries about ${formatQuantity(ripple, 'A')} rms ripple current; choose a capacitor rated for it at ${formatQuantity(2 * input.mainsFrequency, 'Hz')}.`,
    },
    {
      level: 'warning',
      code: 'rectifier-peak',
      message: `The rectifier sees peaks of about ${formatQuantity(peakI, 'A')} every half-cycle, more at switch-on; check its repetitive and surge ratings.`,
    },
    input.rectifier === 'valve' && {
      level: 'warning',
      code: 'valve-rectifier-limits',
      message:
        'Valve rectifiers limit the reservoir capacitance and need a minimum source resistance per anode; check the valve’s published limits before fitting a larger reservoir.',
    },
    LOCAL_CODES,
  ]);
}

export const loadedBplus: ReckonerDefinition<LoadedBplusInput> = {
  kind: 'loaded-bplus',
  label: 'Loaded B+ (capacitor input)',
  summary: 'Average DC, ripple and rectifier currents behind a capacitor-input filter, solved numerically.',
  inputs,
  fields,
  compute,
  cautions,
  keyOutputs: ['averageDc', 'ripplePeakToPeak', 'noLoadDc', 'peakRectifierCurrent'],
  noLoadOutputs: ['noLoadDc'],
};
