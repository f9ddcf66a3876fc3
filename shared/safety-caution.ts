/** The standing safety caution: a bold lead and the text after it. */
export interface Caution {
  lead: string;
  text: string;
}

const LEAD = 'Lethal voltages.';
const HAZARD =
  'Valve equipment holds hundreds of volts DC, and filter capacitors stay charged after switch-off. ' +
  'Work one hand, bring new or repaired units up on an isolation transformer or a current-limited supply, ' +
  'and discharge and verify with a meter before touching.';
const CODES = 'Follow your local electrical codes and licensed practice.';

/** Shown in the app shell, on sign-in and with every revision. */
export const SAFETY_CAUTION: Caution = {
  lead: LEAD,
  text: `${HAZARD} Benchwright records that a qualified person approved a procedure; it does not make any procedure safe. ${CODES}`,
};

/** On every run sheet, on screen and in the PDF. */
export const RUN_SHEET_CAUTION: Caution = {
  lead: LEAD,
  text:
    `${HAZARD} This run sheet records what was measured and that a qualified person approved the procedure ` +
    `followed; it does not make the procedure or the unit safe. ${CODES}`,
};
