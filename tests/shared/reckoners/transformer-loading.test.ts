import { describe, expect, it } from 'vitest';
import { lusolve, matrix } from 'mathjs';
import { expectClose, num, run } from '../helpers';

/**
 * One winding on an ideal transformer with its winding resistances and a resistive load, solved as
 * a linear circuit (Kirchhoff's laws, ideal-transformer relations V₂ = n V₁, I₁ = n I₂) by mathjs's
 * LU solver [docs/references.md §7, §10], not by the reckoner's referred-resistance formula.
 */
function solveCircuit(vp: number, rp: number, n: number, rs: number, rl: number) {
  // Unknowns: V1 (primary terminals), I1, V2 (secondary EMF), I2.
  const a = matrix([
    [1, rp, 0, 0], // vp = V1 + rp I1
    [-n, 0, 1, 0], // V2 = n V1
    [0, 1, 0, -n], // I1 = n I2
    [0, 0, 1, -(rs + rl)], // V2 = (rs + rl) I2
  ]);
  const x = (lusolve(a, [vp, 0, 0, 0]).valueOf() as number[][]).map((r) => r[0]!);
  const i2 = x[3]!;
  return { i2, loadVolts: i2 * rl };
}

describe('transformer loading', () => {
  it('the voltage under load and the source resistance agree with the solved circuit [Kirchhoff + ideal transformer, mathjs lusolve]', () => {
    const vp = 230;
    const n = 300 / 230;
    const circuit = solveCircuit(vp, 15, n, 90, 2500);
    const { outputs } = run('transformer-loading', {
      mainsVoltage: '230 V',
      primaryResistance: '15 Ω',
      efficiency: '100 %',
      windings: [{ volts: '300 V', amps: `${circuit.i2} A`, resistance: '90 Ω' }],
    });
    expectClose(num(outputs, 'winding1.loadedVoltage'), circuit.loadVolts, 1e-9);
    expectClose(num(outputs, 'winding1.sourceResistance'), 90 + 15 * n * n, 1e-12);
    expectClose(num(outputs, 'winding1.regulation'), (100 * (300 - circuit.loadVolts)) / 300, 1e-9);
  });

  it('totals the VA and flags an overloaded transformer and winding', () => {
    const { outputs, cautions } = run('transformer-loading', {
      ratedVA: '50 VA',
      windings: [
        { label: 'HT', volts: '300 V', amps: '150 mA', ratedAmps: '120 mA' },
        { label: 'Heaters', volts: '6.3 V', amps: '2 A' },
      ],
    });
    expectClose(num(outputs, 'totalVA'), 45 + 12.6, 1e-12);
    expectClose(num(outputs, 'loading'), (100 * 57.6) / 50, 1e-12);
    const codes = cautions.map((c) => c.code);
    expect(codes).toContain('transformer-overloaded');
    expect(cautions.find((c) => c.code === 'winding-overloaded')?.field).toBe('windings.0.amps');
  });
});
