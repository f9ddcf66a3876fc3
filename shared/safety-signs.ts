/**
 * The one safety-sign system (docs/references.md §8, Signs): the ANSI Z535.4 signal words with their
 * ANSI Z535.1 / ISO 3864-4 safety colours, and whether the warning triangle goes with them. Authored
 * hazard notes, reckoner cautions, bench-run steps, the run sheet and the PDF all read it.
 *
 * Colours are the usual screen renderings of the standards' safety red, orange, yellow and blue
 * [from memory]; every pairing of field and ink keeps a WCAG 2.1 contrast of at least 4.5:1.
 */
export const SIGNAL_LEVELS = ['danger', 'warning', 'caution', 'notice'] as const;
export type SignalLevel = (typeof SIGNAL_LEVELS)[number];

export interface SafetySign {
  /** The signal word, as printed (upper case, per ANSI Z535.4). */
  word: string;
  /** What the word means to the reader, for tooltips and the legend. */
  meaning: string;
  /** The field colour (sRGB hex) and the ink set on it. */
  field: string;
  ink: string;
  /** DANGER, WARNING and CAUTION carry the warning triangle; NOTICE (property, not people) does not. */
  triangle: boolean;
}

export const SAFETY_SIGNS: Record<SignalLevel, SafetySign> = {
  danger: {
    word: 'DANGER',
    meaning: 'will kill or seriously injure if not avoided',
    field: '#c8102e',
    ink: '#ffffff',
    triangle: true,
  },
  warning: {
    word: 'WARNING',
    meaning: 'could kill or seriously injure if not avoided',
    field: '#ff7900',
    ink: '#111111',
    triangle: true,
  },
  caution: {
    word: 'CAUTION',
    meaning: 'could cause minor or moderate injury if not avoided',
    field: '#ffd100',
    ink: '#111111',
    triangle: true,
  },
  notice: {
    word: 'NOTICE',
    meaning: 'could damage the equipment; no injury',
    field: '#0b5cad',
    ink: '#ffffff',
    triangle: false,
  },
};

/** The triangle itself (ISO 3864 general warning: yellow field, black border and mark), one path set. */
export const WARNING_TRIANGLE = {
  viewBox: '0 0 48 44',
  outline: 'M24 3 L45 41 H3 Z',
  field: '#ffd100',
  ink: '#111111',
  bar: { x: 21.5, y: 15, width: 5, height: 15 },
  dot: { cx: 24, cy: 35, r: 2.8 },
} as const;

/** A reckoner caution's level on the sign scale: its `note` is a NOTICE. */
export function signFor(level: SignalLevel | 'note'): SafetySign {
  return SAFETY_SIGNS[level === 'note' ? 'notice' : level];
}
