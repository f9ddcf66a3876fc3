import { describe, expect, it } from 'vitest';
import { checkReading, parseTolerance, toleranceBand } from '../../../shared/reckoners/reading-tolerance';
import { ReckonerInputError } from '../../../shared/reckoners/errors';
import { expectClose, fieldErrors, num, run, thrownBy } from '../helpers';

describe('toleranceBand / checkReading', () => {
  it('230 V ± 10 % → 207–253 V [std: IEC 60038:2009, docs/references.md §2]', () => {
    expect(toleranceBand(230, { kind: 'percent', percent: 10 })).toEqual({ low: 207, high: 253 });
  });

  it('ANSI C84.1 Range A 114–126 V and Range B 110–127 V on 120 V [std, from memory; docs/references.md §2]', () => {
    expect(toleranceBand(120, { kind: 'percent', percent: 5 })).toEqual({ low: 114, high: 126 });
    expect(toleranceBand(120, { kind: 'asymmetric', below: 10, above: 7, basis: 'absolute' })).toEqual({
      low: 110,
      high: 127,
    });
  });

  it('limits are inclusive; just outside is out [product rule: a reading on the limit is accepted]', () => {
    const tol = { kind: 'percent', percent: 10 } as const;
    expect(checkReading({ expected: 230, tolerance: tol, measured: 253 }).within).toBe(true);
    expect(checkReading({ expected: 230, tolerance: tol, measured: 207 }).within).toBe(true);
    expect(checkReading({ expected: 230, tolerance: tol, measured: 253.01 }).within).toBe(false);
    expect(checkReading({ expected: 230, tolerance: tol, measured: 206.99 }).within).toBe(false);
  });

  it('deviation: 6.9 V on a 6.3 V winding is +9.52 % [derived: (6.9 − 6.3) ÷ 6.3 × 100, docs/references.md §6 regulation example]', () => {
    const r = checkReading({ expected: 6.3, tolerance: { kind: 'percent', percent: 10 }, measured: 6.9 });
    expectClose(r.deviation, 0.6);
    expectClose(r.deviationPercent!, 9.52);
    expect(r.within).toBe(true);
  });

  it('handles negative expected values (grid bias) and zero with an absolute tolerance [derived: band = expected ± |expected| × p]', () => {
    expect(toleranceBand(-40, { kind: 'percent', percent: 10 })).toEqual({ low: -44, high: -36 });
    const r = checkReading({ expected: -40, tolerance: { kind: 'percent', percent: 10 }, measured: -45 });
    expect(r.within).toBe(false);
    expectClose(r.deviationPercent!, -12.5);
    const z = checkReading({ expected: 0, tolerance: { kind: 'absolute', amount: 5 }, measured: 3 });
    expect(z).toEqual({ within: true, deviation: 3, deviationPercent: null, low: -5, high: 5 });
  });

  it('asymmetric percent band: 300 V −5 % / +10 % → 285–330 V [derived]', () => {
    expect(toleranceBand(300, { kind: 'asymmetric', below: 5, above: 10, basis: 'percent' })).toEqual({
      low: 285,
      high: 330,
    });
  });

  it('throws a field-named error for bad tolerances', () => {
    expect(() => toleranceBand(230, { kind: 'percent', percent: -1 })).toThrow(ReckonerInputError);
    expect(() => toleranceBand(0, { kind: 'percent', percent: 5 })).toThrow(/non-zero expected/);
    expect(() =>
      checkReading({ expected: 1, tolerance: { kind: 'absolute', amount: 1 }, measured: Number.NaN }),
    ).toThrow(/measured/);
    const infinite = thrownBy(() => toleranceBand(230, { kind: 'absolute', amount: Infinity }));
    expect(infinite).toBeInstanceOf(ReckonerInputError);
    expect(infinite).toMatchObject({ field: 'tolerance.amount', reason: 'must be a finite number' });
    const negative = thrownBy(() =>
      toleranceBand(230, { kind: 'asymmetric', below: -1, above: 5, basis: 'percent' }),
    );
    expect(negative).toBeInstanceOf(ReckonerInputError);
    expect(negative).toMatchObject({ field: 'tolerance.below', reason: 'must not be negative' });
  });
});

describe('parseTolerance', () => {
  it.each([
    ['±10 %', { kind: 'percent', percent: 10 }],
    ['5%', { kind: 'percent', percent: 5 }],
    ['± 2 V', { kind: 'absolute', amount: 2 }],
    ['+/-500mV', { kind: 'absolute', amount: 0.5 }],
    ['+10/-5 %', { kind: 'asymmetric', above: 10, below: 5, basis: 'percent' }],
    ['-5 % / +10 %', { kind: 'asymmetric', above: 10, below: 5, basis: 'percent' }],
    ['+7 V / -10 V', { kind: 'asymmetric', above: 7, below: 10, basis: 'absolute' }],
  ])('%s', (text, tol) => {
    expect(parseTolerance(text, 'V')).toEqual(tol);
  });
  it.each(['', 'lots', '+5 % / -2 V', '±2 A', '+5 / +2'])('rejects %s', (text) => {
    expect(() => parseTolerance(text, 'V')).toThrow();
  });
});

describe('reading-tolerance reckoner', () => {
  it('gives the band without a measurement, and the verdict with one: 325 V ± 5 % → 308.75–341.25 V [derived]', () => {
    const a = run('reading-tolerance', { unit: 'V', expected: '325 V', tolerance: '±5 %' });
    expectClose(num(a.outputs, 'low'), 308.75);
    expectClose(num(a.outputs, 'high'), 341.25);
    expect(a.outputs.within).toBeUndefined();
    const b = run('reading-tolerance', {
      unit: 'V',
      expected: 325,
      tolerance: { kind: 'percent', percent: 5 },
      measured: '350 V',
    });
    expect(b.outputs.within!.value).toBe(false);
    expect(b.outputs.verdict!.value).toBe('out');
    expectClose(num(b.outputs, 'deviation'), 25);
  });

  it('gives the verdicts worked by hand for 100 V ± 10 % (90–110 V, limits included), as checkReading does [derived]', () => {
    const cases: [number, boolean][] = [
      [100, true],
      [109.999, true],
      [110, true],
      [110.001, false],
      [90, true],
      [89.9, false],
    ];
    for (const [measured, within] of cases) {
      const r = run('reading-tolerance', { unit: 'V', expected: 100, tolerance: '±10 %', measured }).outputs;
      expect(r.within!.value, `${measured} V`).toBe(within);
      // The one place the decision is made: the reckoner and checkReading must agree.
      expect(
        checkReading({ expected: 100, tolerance: { kind: 'percent', percent: 10 }, measured }).within,
        `${measured} V`,
      ).toBe(within);
    }
  });

  it('reads expected and measured in the chosen unit and rejects other units', () => {
    const r = run('reading-tolerance', {
      unit: 'A',
      expected: '100 mA',
      tolerance: '± 5 mA',
      measured: '0.104',
    });
    expect(r.outputs.within!.value).toBe(true);
    expect(
      fieldErrors('reading-tolerance', { unit: 'A', expected: '100 V', tolerance: '±5 %' })[0]!.field,
    ).toBe('expected');
    expect(fieldErrors('reading-tolerance', { unit: 'V', expected: 0, tolerance: '±5 %' })[0]!.field).toBe(
      'tolerance',
    );
    expect(
      fieldErrors('reading-tolerance', {
        unit: 'V',
        expected: 10,
        tolerance: { kind: 'percent', percent: -3 },
      })[0]!.field,
    ).toBe('tolerance.percent');
  });
});
