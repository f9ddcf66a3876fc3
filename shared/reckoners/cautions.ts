import { formatQuantity } from '../units/format';
import { HAZARD_DC_SOURCE, HAZARD_DC_VOLTS } from '../standards/thresholds';
import { SRC } from './outputs';
import type { Caution } from './types';

export const LOCAL_CODES: Caution = {
  level: 'note',
  code: 'local-codes',
  message:
    'These figures are estimates for planning a procedure. Verify against local electrical codes and licensed practice; a qualified person decides how the work is done.',
};

/** A node above the DC hazard threshold. */
export function hazardousVoltage(volts: number, where: string, threshold = HAZARD_DC_VOLTS): Caution | null {
  if (Math.abs(volts) <= threshold) return null;
  return {
    level: 'danger',
    code: 'hazardous-voltage',
    message: `${where} reaches about ${formatQuantity(volts, 'V')}, above ${formatQuantity(threshold, 'V')} DC: a hazardous, potentially lethal voltage. Work one hand, isolated or current-limited at first power-up.`,
    source: HAZARD_DC_SOURCE,
  };
}

/** Stored charge in a capacitor: it stays after switch-off. */
export function storedEnergy(capacitance: number, volts: number, where: string): Caution | null {
  if (Math.abs(volts) <= HAZARD_DC_VOLTS) return null;
  const joules = 0.5 * capacitance * volts * volts;
  return {
    level: 'danger',
    code: 'stored-charge',
    message: `${where} holds about ${formatQuantity(joules, 'J')} at ${formatQuantity(volts, 'V')} and stays charged after switch-off. Discharge through a suitable resistor and verify with a meter before touching.`,
  };
}

export function compact(list: (Caution | null | undefined | false)[]): Caution[] {
  return list.filter((c): c is Caution => !!c);
}

/**
 * An LC section resonating near or above half the ripple frequency amplifies ripple instead of
 * removing it (common practice, no source). `where` names the section when a block has several.
 */
export function resonanceNearRipple(
  f0: number,
  ripple: number,
  field: string,
  where?: string,
): Caution | null {
  if (f0 <= ripple / 2) return null;
  return {
    level: 'warning',
    code: 'resonance-near-ripple',
    field,
    message: `${where ? `${where}: the` : 'The'} LC resonance of ${formatQuantity(f0, 'Hz')} is ${f0 >= ripple ? 'at or above' : 'near'} the ${formatQuantity(ripple, 'Hz')} ripple, so the section amplifies ripple instead of removing it. Keep the resonance well below half the ripple frequency.`,
    source: SRC.commonPractice,
  };
}
