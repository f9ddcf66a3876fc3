import { describe, expect, it } from 'vitest';
import { evaluate } from 'mathjs';
import { rippleApproxFullWave, simulateCapacitorInput } from '../../../shared/reckoners/capacitor-input';
import { expectClose, fieldErrors, num, run } from '../helpers';

describe('loaded-bplus', () => {
  it('ripple approximation I/(2fC): 100 mA, 50 Hz, 47 µF → 21.28 V [derived, docs/references.md §3; cross-check with mathjs]', () => {
    const byMathjs = evaluate('100 mA / (2 * 50 Hz * 47 uF)').toNumber('V');
    expectClose(byMathjs, 21.28);
    expectClose(rippleApproxFullWave(0.1, 50, 47e-6), byMathjs, 1e-12);
  });

  it('at light ripple the simulation matches I/(2fC) less the conduction time [derived]', () => {
    // 470 µF, 100 mA, 50 Hz: ΔV ≈ 2.128 V. The capacitor discharges at I/C only while the
    // rectifier is off, so the exact sawtooth is I(1 − conduction)/(2fC) and never more than I/(2fC).
    const { outputs } = run('loaded-bplus', {
      windingVoltage: '300 V',
      sourceResistance: '2R2',
      reservoir: '470 µF',
      mainsFrequency: '50 Hz',
      loadCurrent: '100 mA',
    });
    const approx = evaluate('100 mA / (2 * 50 Hz * 470 uF)').toNumber('V');
    const ripple = num(outputs, 'ripplePeakToPeak');
    const conduction = num(outputs, 'conduction') / 100;
    expect(ripple).toBeLessThanOrEqual(approx);
    expectClose(ripple, approx, 0.1, 'within 10 % of I/(2fC)');
    expectClose(ripple, approx * (1 - conduction), 0.01, 'sawtooth with conduction time removed');
    // rms of a sawtooth ≈ ΔV_pp / (2√3) [derived, docs/references.md §3]
    expectClose(num(outputs, 'rippleRms'), ripple / (2 * Math.sqrt(3)), 0.05);
  });

  it('matches Schade’s small-Rs/RL limit, full-wave E_dc/E_pk at ωCR_L = 100 → 0.9845 [derived; Schade 1943 curves (Radiotron Designer’s Handbook ch. 30, from memory) read ± 3 %]', () => {
    // Resistive load R_L chosen so ωCR_L = 100; iterate the constant-current load to I = E_dc / R_L.
    const f = 50;
    const C = 100e-6;
    const RL = 100 / (2 * Math.PI * f * C);
    const Epk = 100;
    let I = Epk / RL;
    let Edc = 0;
    for (let i = 0; i < 20; i++) {
      Edc = simulateCapacitorInput({ vPeak: Epk, drop: 0, rSource: RL * 1e-4, capacitance: C, frequency: f, loadCurrent: I }).averageDc;
      I = Edc / RL;
    }
    const schadeLimit = 1 / (1 + Math.PI / (2 * 100));
    expectClose(schadeLimit, 0.9845, 1e-4);
    expectClose(Edc / Epk, schadeLimit, 0.005); // the limit assumes discharge through the whole half-cycle
    expect(Math.abs(Edc / Epk - 0.9845)).toBeLessThan(0.03); // curve-reading tolerance
  });

  it('keeps charge balance: winding rms² = capacitor rms² + I² for a bridge [derived]', () => {
    const { outputs } = run('loaded-bplus', { windingVoltage: 250, sourceResistance: 60, reservoir: '47u', loadCurrent: '120mA' });
    const winding = num(outputs, 'windingRmsCurrent');
    const cap = num(outputs, 'capacitorRippleCurrent');
    expectClose(winding ** 2, cap ** 2 + 0.12 ** 2, 0.002);
    expect(num(outputs, 'peakRectifierCurrent')).toBeGreaterThan(0.12 * 2);
    expect(num(outputs, 'averageDc')).toBeLessThan(Math.SQRT2 * 250 - 1.8);
  });

  it('splits the winding current between halves of a centre-tap winding [derived]', () => {
    const common = { windingVoltage: 250, sourceResistance: 60, reservoir: '47u', loadCurrent: '120mA' };
    const bridge = run('loaded-bplus', { ...common, rectifier: 'silicon-bridge', diodeDrop: 0 }).outputs;
    const ct = run('loaded-bplus', { ...common, rectifier: 'silicon-centre-tap', diodeDrop: 0 }).outputs;
    expectClose(num(ct, 'windingRmsCurrent'), num(bridge, 'windingRmsCurrent') / Math.SQRT2, 1e-6);
  });

  it('with no load the reservoir sits at the peak less the drop, with no ripple [derived]', () => {
    const { outputs } = run('loaded-bplus', { windingVoltage: 300, sourceResistance: 50, reservoir: '47u', loadCurrent: 0 });
    expectClose(num(outputs, 'averageDc'), Math.SQRT2 * 300 - 1.8, 1e-9);
    expect(num(outputs, 'ripplePeakToPeak')).toBe(0);
  });

  it('reports an overload as an error on loadCurrent, not NaN', () => {
    const errs = fieldErrors('loaded-bplus', { windingVoltage: 100, sourceResistance: 100, reservoir: '1u', loadCurrent: 2 });
    expect(errs[0]!.field).toBe('loadCurrent');
  });

  it('cautions about hazard, stored charge, ripple current and rectifier peaks', () => {
    const { cautions } = run('loaded-bplus', { windingVoltage: 300, sourceResistance: 50, reservoir: '47u', loadCurrent: '0.1', rectifier: 'valve' });
    expect(cautions.map((c) => c.code)).toEqual(
      expect.arrayContaining(['hazardous-voltage', 'stored-charge', 'ripple-current', 'rectifier-peak', 'valve-rectifier-limits', 'local-codes']),
    );
  });
});
