import { describe, expect, it } from 'vitest';
import { parseQuantity, QuantityParseError } from '../../../shared/units/parse';
import { expectClose, thrownBy } from '../helpers';

const cases: [string, string | undefined, number, string, string][] = [
  // [input, expected unit, value in SI base, unit, provenance]
  ['47u', 'F', 47e-6, 'F', 'SI prefixes (SI Brochure, docs/references.md §4)'],
  ['47 µF', undefined, 47e-6, 'F', 'SI prefixes'],
  ['47 μF', undefined, 47e-6, 'F', 'Greek mu accepted as micro'],
  ['0.47uF', undefined, 0.47e-6, 'F', 'SI prefixes'],
  ['100 mA', undefined, 0.1, 'A', 'SI prefixes'],
  ['6.3V', undefined, 6.3, 'V', 'SI'],
  ['350 VAC', undefined, 350, 'V', 'trade usage: AC qualifier dropped'],
  ['6.3 V AC', undefined, 6.3, 'V', 'trade usage'],
  ['450 VDC', 'V', 450, 'V', 'trade usage'],
  ['2.2 kΩ', undefined, 2200, 'Ω', 'SI prefixes'],
  ['10 kohm', undefined, 10000, 'Ω', 'SI prefixes'],
  ['1 Meg', 'Ω', 1e6, 'Ω', 'common practice: Meg for mega'],
  ['53.9 VA', undefined, 53.9, 'VA', 'SI'],
  ['50 Hz', undefined, 50, 'Hz', 'SI'],
  ['10 H', undefined, 10, 'H', 'SI'],
  ['200 ms', undefined, 0.2, 's', 'SI prefixes'],
  ['85 %', undefined, 85, '%', 'percent kept as written'],
  ['4.7e-5', 'F', 4.7e-5, 'F', 'engineering notation'],
  ['-12 V', undefined, -12, 'V', 'negative value'],
  ['−12 V', undefined, -12, 'V', 'Unicode minus'],
  ['230', 'V', 230, 'V', 'bare number takes the expected unit'],
  ['230', undefined, 230, '', 'bare number, no unit'],
  // IEC 60062 RKM code [std: IEC 60062]
  ['R47', undefined, 0.47, 'Ω', 'IEC 60062 RKM'],
  ['4R7', undefined, 4.7, 'Ω', 'IEC 60062 RKM'],
  ['470R', undefined, 470, 'Ω', 'IEC 60062 RKM'],
  ['4K7', undefined, 4700, 'Ω', 'IEC 60062 RKM'],
  ['4k7', undefined, 4700, 'Ω', 'IEC 60062 RKM'],
  ['47K3', undefined, 47300, 'Ω', 'IEC 60062 RKM'],
  ['4M7', undefined, 4.7e6, 'Ω', 'IEC 60062 RKM'],
  ['1M0', undefined, 1e6, 'Ω', 'IEC 60062 RKM'],
  ['4n7', undefined, 4.7e-9, 'F', 'IEC 60062 RKM (capacitors)'],
  ['4µ7', undefined, 4.7e-6, 'F', 'IEC 60062 RKM (capacitors)'],
  ['2p2', 'F', 2.2e-12, 'F', 'IEC 60062 RKM (capacitors)'],
  ['4k7 Ω', undefined, 4700, 'Ω', 'IEC 60062 RKM with unit'],
  ['6V3', undefined, 6.3, 'V', 'common practice: capacitor voltage marking'],
];

describe('parseQuantity', () => {
  it.each(cases)('%s (expected %s) → %d %s [%s]', (text, expectedUnit, value, unit) => {
    const q = parseQuantity(text, expectedUnit);
    expectClose(q.value, value, 1e-12, text);
    expect(q.unit).toBe(unit);
  });

  it.each([
    ['', 'empty'],
    ['abc', 'not a number'],
    ['4,7 µF', 'comma'],
    ['12 parsecs', 'unknown unit'],
    ['5 V', 'wrong unit for F'],
    ['4m7', 'ambiguous RKM milli'],
    ['1e400 V', 'overflow'],
    ['5 k%', 'prefixed percent'],
    ['R47 F', 'R means ohms'],
  ])('rejects "%s" (%s) with a QuantityParseError', (text) => {
    const expected = text === '5 V' ? 'F' : undefined;
    expect(() => parseQuantity(text, expected)).toThrow(QuantityParseError);
  });

  it('names the input and the reason in the message', () => {
    const e = thrownBy(() => parseQuantity('5 V', 'F'));
    expect(e).toBeInstanceOf(QuantityParseError);
    expect((e as Error).message).toMatch(/"5 V"/);
    expect((e as Error).message).toMatch(/expected a value in F/);
  });
});
