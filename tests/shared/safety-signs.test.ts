import { colord, extend } from 'colord';
import a11yPlugin from 'colord/plugins/a11y';
import { describe, expect, it } from 'vitest';
import { SAFETY_SIGNS, SIGNAL_LEVELS, WARNING_TRIANGLE, signFor } from '../../shared/safety-signs';

extend([a11yPlugin]);

describe('the safety-sign system (docs/references.md §8, Signs)', () => {
  it('has the four ANSI Z535.4 signal words in order of severity', () => {
    expect(SIGNAL_LEVELS.map((l) => SAFETY_SIGNS[l].word)).toEqual([
      'DANGER',
      'WARNING',
      'CAUTION',
      'NOTICE',
    ]);
  });

  it('puts the warning triangle on hazards to people only (ANSI Z535.4: none with NOTICE)', () => {
    expect(SIGNAL_LEVELS.filter((l) => SAFETY_SIGNS[l].triangle)).toEqual(['danger', 'warning', 'caution']);
  });

  it('keeps each colour in its standard hue family: red, orange, yellow, blue (ISO 3864-4 / ANSI Z535.1)', () => {
    const hue = (l: (typeof SIGNAL_LEVELS)[number]) => colord(SAFETY_SIGNS[l].field).toHsl().h;
    expect(hue('danger') >= 345 || hue('danger') <= 10).toBe(true);
    expect(hue('warning')).toBeGreaterThan(15);
    expect(hue('warning')).toBeLessThan(40);
    expect(hue('caution')).toBeGreaterThan(42);
    expect(hue('caution')).toBeLessThan(60);
    expect(hue('notice')).toBeGreaterThan(195);
    expect(hue('notice')).toBeLessThan(230);
  });

  // WCAG 2.1 SC 1.4.3: 4.5:1 for text; computed by colord's a11y plugin, not by project code.
  it.each(SIGNAL_LEVELS)('%s: the ink on its field reads at 4.5:1 or better (WCAG 2.1 §1.4.3)', (level) => {
    const sign = SAFETY_SIGNS[level];
    expect(colord(sign.ink).contrast(sign.field)).toBeGreaterThanOrEqual(4.5);
  });

  it('draws the triangle as ISO 3864 does: black mark on safety yellow', () => {
    expect(colord(WARNING_TRIANGLE.ink).contrast(WARNING_TRIANGLE.field)).toBeGreaterThanOrEqual(4.5);
    expect(WARNING_TRIANGLE.field).toBe(SAFETY_SIGNS.caution.field);
  });

  it("reads a reckoner caution's note level as a NOTICE", () => {
    expect(signFor('note').word).toBe('NOTICE');
    expect(signFor('danger').word).toBe('DANGER');
  });
});
