/** Safety thresholds with the standards that name them. */
export const HAZARD_DC_VOLTS = 60;
// Source notes are shown to technicians: they cite the standard and clause only. The ES1 figure was
// recalled, not re-read; docs/references.md §8 marks it [std, from memory].
export const HAZARD_DC_SOURCE =
  'IEC 62368-1 ES1 limit, 60 V DC; IEC 60204-1 clause 6.2.4 uses 60 V for residual voltage';
/** IEC 60204-1 6.2.4: stored charge above 60 V must fall to 60 V or less within 5 s of disconnection. */
export const DISCHARGE_TIME_S = 5;
export const DISCHARGE_TIME_SOURCE = 'IEC 60204-1 clause 6.2.4';
/** IEC 61010-1 charge limit (partly from memory; docs/references.md §8 says so, the note on screen does not). */
export const CHARGE_LIMIT_C = 45e-6;
export const CHARGE_LIMIT_SOURCE = 'IEC 61010-1 hazardous-live charge limit, 45 µC';
/** Resistor part rating at least twice its dissipation (common practice). */
export const RESISTOR_DERATING = 2;
/** Common power ratings for through-hole and wirewound resistors (common practice). */
export const RESISTOR_POWER_RATINGS: readonly number[] = [
  0.125, 0.25, 0.5, 1, 2, 3, 5, 7, 10, 15, 20, 25, 50,
];
