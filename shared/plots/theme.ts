/**
 * The app's theme colours a plot draws with, as sRGB hex: the same values as the `@theme` block of
 * src/styles.css (tests/shared/plots/theme.test.ts keeps them equal). Plots set them as SVG
 * presentation attributes, so the page and the PDF (svg-to-pdfkit reads attributes only) draw alike.
 */
export const PLOT_COLOURS = {
  card: '#fbf8f2',
  rule: '#d8ccb5',
  graphite: '#2b2a28',
  graphiteSoft: '#5a5650',
  accent: '#1d6b63',
  accentDeep: '#134a44',
  accentWash: '#dcebe7',
  ok: '#2f6b2f',
  out: '#a3261b',
} as const;

/** The theme's CSS variable for each plot colour (`--color-<name>`). */
export const THEME_VARIABLE: Record<keyof typeof PLOT_COLOURS, string> = {
  card: '--color-card',
  rule: '--color-rule',
  graphite: '--color-graphite',
  graphiteSoft: '--color-graphite-soft',
  accent: '--color-accent',
  accentDeep: '--color-accent-deep',
  accentWash: '--color-accent-wash',
  ok: '--color-ok',
  out: '--color-out',
};

/** Figures in the monospace, words in the reading face (the PDF maps both to its own fonts). */
export const PLOT_FONTS = {
  figures: "'JetBrains Mono', ui-monospace, monospace",
  words: "'Literata', Georgia, serif",
} as const;
