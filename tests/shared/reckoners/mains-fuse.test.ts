import { describe, expect, it } from 'vitest';
import { evaluate } from 'mathjs';
import { pulseI2t, gateFor } from '../../../shared/reckoners/mains-fuse';
import { expectClose, fieldErrors, num, run } from '../helpers';

const windings = [
  { volts: 250, amps: 0.1 },
  { volts: '6.3 V', amps: '3 A' },
  { volts: '5V', amps: 2 },
];

describe('mains-fuse', () => {
  it('sums secondary VA: 250 V × 0.1 A + 6.3 V × 3 A + 5 V × 2 A = 53.9 VA [derived, docs/references.md §1]', () => {
    const { outputs } = run('mains-fuse', { windings, mainsVoltage: 120, efficiency: 85 });
    expectClose(num(outputs, 'totalVA'), 53.9);
  });

  it('primary current at η 0.85: 120 V → 0.5284 A, 230 V → 0.2757 A [derived, docs/references.md §1]', () => {
    expectClose(num(run('mains-fuse', { windings, mainsVoltage: '120 V', efficiency: '85 %' }).outputs, 'primaryCurrent'), 0.5284);
    expectClose(num(run('mains-fuse', { windings, mainsVoltage: '230 V', efficiency: 85 }).outputs, 'primaryCurrent'), 0.2757);
  });

  it('agrees with mathjs on the unit arithmetic [derived; cross-check with mathjs]', () => {
    const byMathjs = evaluate('53.9 VA / 0.85 / (120 V)').toNumber('A');
    expectClose(num(run('mains-fuse', { load: 'va', va: '53.9 VA', mainsVoltage: 120 }).outputs, 'primaryCurrent'), byMathjs, 1e-9);
  });

  it('chooses the next IEC 60127-2 rating at or above primary × margin [std: IEC 60127-2 R10 values]', () => {
    // 0.5284 A × 1.0 → 630 mA; 0.2757 A × 1.25 = 0.345 A → 400 mA
    expect(num(run('mains-fuse', { windings, mainsVoltage: 120, margin: 1 }).outputs, 'fuseRating')).toBe(0.63);
    expect(num(run('mains-fuse', { windings, mainsVoltage: 230, margin: 1.25 }).outputs, 'fuseRating')).toBe(0.4);
    expect(num(run('mains-fuse', { windings, mainsVoltage: 230, margin: 1 }).outputs, 'fuseRating')).toBe(0.315);
    // North American sizes [common practice, no source]: 0.5284 A → 3/4 A
    expect(num(run('mains-fuse', { windings, mainsVoltage: 120, margin: 1, series: 'north-american' }).outputs, 'fuseRating')).toBe(0.75);
  });

  it('asks for a time-delay fuse and says why [common practice; F gate IEC 60127-2 sheets 1/2, from memory]', () => {
    const { outputs } = run('mains-fuse', { windings, mainsVoltage: 230 });
    expect(outputs.fuseType!.value).toBe('T');
    expect(outputs.fuseType!.explanation).toMatch(/surge/);
    expect(outputs.fuseType!.explanation).toMatch(/20 ms/);
    expect(outputs.fuseDesignation!.value).toBe('T 400 mA');
  });

  it('estimates the switch-on surge as ten times running current, marked as a rule of thumb [common practice, no source]', () => {
    const { outputs } = run('mains-fuse', { windings, mainsVoltage: 230 });
    expectClose(num(outputs, 'inrushCurrent'), 10 * 0.2757);
    expect(outputs.inrushCurrent!.source).toMatch(/common practice/);
    expect(outputs.inrushCurrent!.explanation).toMatch(/estimate/i);
  });

  it('checks the surge against the IEC 60127-2 sheet 3 time-lag gates [std: IEC 60127-2 sheet 3, from memory]', () => {
    // 2.757 A surge on a 400 mA fuse = 6.9 × In → the 10 × In gate: must not open before 10 ms.
    const { outputs, cautions } = run('mains-fuse', { windings, mainsVoltage: 230 });
    expectClose(num(outputs, 'inrushMultipleOfRating'), 2.757 / 0.4);
    expect(outputs.inrushGate!.value).toMatch(/10 × In/);
    expect(outputs.inrushWithinGate!.value).toBe(false);
    expect(cautions.some((c) => c.code === 'inrush')).toBe(true);
    // A small surge (2 × running, on 1.25 margin → ≤ 2.75 × In) sits inside the 0.2 s gate.
    const small = run('mains-fuse', { windings, mainsVoltage: 230, inrushMultiple: 2 });
    expect(small.outputs.inrushWithinGate!.value).toBe(true);
    expect(gateFor(2.75)).toEqual({ multiple: 2.75, min: 0.2, max: 10 });
    expect(gateFor(4)).toEqual({ multiple: 4, min: 0.04, max: 3 });
    expect(gateFor(10.5)).toBeNull();
  });

  it('computes pulse I²t for the shapes in docs/references.md §1 [derived]', () => {
    expectClose(pulseI2t('rectangle', 10, 0.01), 1.0);
    expectClose(pulseI2t('half-sine', 30, 0.01), 4.5);
    expectClose(pulseI2t('triangle', 30, 0.01), 3.0);
  });

  it('rejects a load beyond the miniature-fuse series, naming the field', () => {
    const errs = fieldErrors('mains-fuse', { load: 'va', va: '3000 VA', mainsVoltage: 120 });
    expect(errs[0]!.field).toBe('va');
    expect(errs[0]!.reason).toMatch(/largest rating/);
  });

  it('requires a VA figure or windings according to the choice', () => {
    expect(fieldErrors('mains-fuse', { load: 'va', mainsVoltage: 230 })[0]!.field).toBe('va');
    expect(fieldErrors('mains-fuse', { load: 'windings', windings: [], mainsVoltage: 230 })[0]!.field).toBe('windings');
  });
});
