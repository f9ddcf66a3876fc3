import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { formatQuantity } from '../../../shared/units/format';
import { parseQuantity } from '../../../shared/units/parse';
import { UNITS } from '../../../shared/units/units';

describe('formatQuantity', () => {
  it.each([
    [47e-6, 'F', '47 µF'],
    [4700, 'Ω', '4.7 kΩ'],
    [1.6, 'A', '1.6 A'],
    [325.27, 'V', '325 V'],
    [0.5284, 'A', '528 mA'],
    [0, 'V', '0 V'],
    [-12, 'V', '-12 V'],
    [999.96, 'V', '1 kV'], // rounding carries into the next prefix
    [85, '%', '85 %'],
    [1e-15, 'F', '0.001 pF'],
    [2.2e13, 'Ω', '22 TΩ'],
  ])('%d %s → %s [SI prefixes]', (v, unit, text) => {
    expect(formatQuantity(v, unit)).toBe(text);
  });

  it('honours the significant figures asked for', () => {
    expect(formatQuantity(325.2691, 'V', 5)).toBe('325.27 V');
    expect(formatQuantity(0.52843, 'A', 2)).toBe('530 mA');
  });

  it('refuses NaN and Infinity rather than printing them', () => {
    expect(() => formatQuantity(Number.NaN, 'V')).toThrow(RangeError);
    expect(() => formatQuantity(Infinity, 'V')).toThrow(RangeError);
  });
});

describe('parser round-trips what the formatter prints (property)', () => {
  it('parse(format(x)) equals x rounded to the printed significant figures', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1e-13, max: 1e14, noNaN: true }),
        fc.boolean(),
        fc.constantFrom(...UNITS),
        fc.integer({ min: 1, max: 6 }),
        (mag, negative, unit, sig) => {
          const x = negative ? -mag : mag;
          const text = formatQuantity(x, unit, sig);
          const back = parseQuantity(text, unit);
          expect(back.unit).toBe(unit);
          const rounded = Number(x.toPrecision(sig));
          expect(Math.abs(back.value - rounded)).toBeLessThanOrEqual(Math.abs(rounded) * 1e-9);
        },
      ),
      { numRuns: 2000 },
    );
  });
});
