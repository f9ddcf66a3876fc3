import { readFileSync } from 'node:fs';
import { colord, extend } from 'colord';
import a11yPlugin from 'colord/plugins/a11y';
import { describe, expect, it } from 'vitest';
import { PLOT_COLOURS, THEME_VARIABLE } from '../../../shared/plots/theme';

extend([a11yPlugin]);

describe('plot colours', () => {
  it('are the theme’s colours in src/styles.css', () => {
    const css = readFileSync(new URL('../../../src/styles.css', import.meta.url), 'utf8');
    for (const [name, variable] of Object.entries(THEME_VARIABLE)) {
      const declared = new RegExp(`${variable}:\\s*(#[0-9a-fA-F]{6})`).exec(css)?.[1];
      expect(declared, variable).toBe(PLOT_COLOURS[name as keyof typeof PLOT_COLOURS]);
    }
  });

  it('keep the marks at 3:1 against the card and the band shading (WCAG 2.1 SC 1.4.11, docs/references.md §11)', () => {
    for (const mark of [PLOT_COLOURS.ok, PLOT_COLOURS.out, PLOT_COLOURS.graphiteSoft])
      for (const ground of [PLOT_COLOURS.card, PLOT_COLOURS.accentWash])
        expect(colord(mark).contrast(ground), `${mark} on ${ground}`).toBeGreaterThanOrEqual(3);
  });
});
