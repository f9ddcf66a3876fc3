/**
 * Procedure parameters: the design values stored with a revision, which reckoner fields follow
 * (FieldSpec.follows). A bench run replaces mainsVoltage (and may replace mainsFrequency) with
 * what the technician measured, so every field that follows it is worked out again.
 */
import type { Measure, ParamKey } from './types';

export interface ParamSpec {
  key: ParamKey;
  label: string;
  unit: 'V' | 'Hz';
  measure: Measure;
  min: number;
  max: number;
  default: number;
  help: string;
}

export const PARAM_SPECS: readonly ParamSpec[] = [
  {
    key: 'mainsNominal',
    label: 'Nominal mains',
    unit: 'V',
    measure: 'rms',
    min: 90,
    max: 260,
    default: 230,
    help: 'The mains the unit is designed for; transformer ratings are given at it.',
  },
  {
    key: 'mainsVoltage',
    label: 'Measured mains',
    unit: 'V',
    measure: 'rms',
    min: 80,
    max: 280,
    default: 230,
    help: 'The design figure here; at the bench, what the technician measures.',
  },
  {
    key: 'mainsFrequency',
    label: 'Mains frequency',
    unit: 'Hz',
    measure: 'scalar',
    min: 45,
    max: 65,
    default: 50,
    help: 'The design figure here; at the bench, the supply’s.',
  },
];

export function paramSpec(key: string): ParamSpec | undefined {
  return PARAM_SPECS.find((p) => p.key === key);
}
