import type { Snapshot } from '../../../shared/document/evaluate';
import { evaluateProcedure } from '../../../shared/reckoners';

/** A 300 V (at 230 V) bridge winding feeding a one-stage ladder, a bleeder and a loaded-B+ block, at `mains`. */
export function snapshotAt(mains: number): Snapshot {
  const params = { mainsVoltage: mains, mainsNominal: 230, mainsFrequency: 50 } as Snapshot['params'];
  const { blocks } = evaluateProcedure(
    [
      {
        name: 'noLoad',
        kind: 'peak-no-load',
        inputs: {
          windingVoltage: '300 V',
          mainsNominal: { param: 'mainsNominal' },
          mainsActual: { param: 'mainsVoltage' },
          rectifier: 'silicon-bridge',
          diodeDrop: '0.9 V',
        },
      },
      {
        name: 'ladder',
        kind: 'dropper-ladder',
        inputs: {
          startVoltage: { ref: 'noLoad.noLoadDc' },
          stages: [
            {
              label: 'Screens',
              targetVoltage: '300 V',
              current: '10 mA',
              capacitance: '47u',
              fittedResistance: '4k7',
            },
          ],
        },
      },
      {
        name: 'bleed',
        kind: 'bleeder',
        inputs: {
          capacitance: '100u',
          chargedVoltage: { ref: 'noLoad.noLoadDc' },
          bleederResistance: '100k',
          threshold: '60 V',
        },
      },
      {
        name: 'bplus',
        kind: 'loaded-bplus',
        inputs: {
          windingVoltage: '300 V',
          sourceResistance: '60',
          reservoir: '47u',
          loadCurrent: '0.1 A',
          rectifier: 'silicon-bridge',
        },
      },
    ],
    params,
  );
  return {
    params,
    blocks: blocks.map((b, i) => ({ ...b, id: `b${i}`, section: '' })),
    readings: [],
    errors: [],
  };
}
