import { describe, expect, it } from 'vitest';
import { divide, multiply, unit, type Unit } from 'mathjs';
import { rippleApproxFullWave } from '../../../shared/reckoners/capacitor-input';
import { expectClose, fieldErrors, num, run } from '../helpers';
import { solveByRk4 } from './capacitor-input-rk4';

describe('loaded-bplus against an independent RK4 solution of the circuit [derived: docs/references.md §3]', () => {
  // Silicon bridge: drop 2 × 0.9 V (the default); centre-tap: 0.9 V; valve: the author's fixed drop.
  const cases = [
    {
      name: 'light ripple: 300 V, 2.2 Ω, 470 µF, 50 Hz, 100 mA, bridge',
      inputs: {
        windingVoltage: 300,
        sourceResistance: 2.2,
        reservoir: 470e-6,
        mainsFrequency: 50,
        loadCurrent: 0.1,
        rectifier: 'silicon-bridge',
      },
      drop: 1.8,
    },
    {
      name: 'heavy ripple: 250 V, 60 Ω, 47 µF, 50 Hz, 120 mA, bridge',
      inputs: {
        windingVoltage: 250,
        sourceResistance: 60,
        reservoir: 47e-6,
        mainsFrequency: 50,
        loadCurrent: 0.12,
        rectifier: 'silicon-bridge',
      },
      drop: 1.8,
    },
    {
      name: 'valve: 350 V, 200 Ω, 32 µF, 60 Hz, 80 mA, 15 V fixed drop',
      inputs: {
        windingVoltage: 350,
        sourceResistance: 200,
        reservoir: 32e-6,
        mainsFrequency: 60,
        loadCurrent: 0.08,
        rectifier: 'valve',
        valveDrop: 15,
      },
      drop: 15,
    },
    {
      name: 'centre-tap: 300 V, 100 Ω, 100 µF, 60 Hz, 150 mA',
      inputs: {
        windingVoltage: 300,
        sourceResistance: 100,
        reservoir: 100e-6,
        mainsFrequency: 60,
        loadCurrent: 0.15,
        rectifier: 'silicon-centre-tap',
      },
      drop: 0.9,
    },
  ] as const;

  it.each(cases)('$name', ({ inputs, drop }) => {
    const { outputs } = run('loaded-bplus', inputs);
    const ref = solveByRk4({
      vPeak: Math.SQRT2 * inputs.windingVoltage,
      drop,
      rs: inputs.sourceResistance,
      c: inputs.reservoir,
      f: inputs.mainsFrequency,
      load: { current: inputs.loadCurrent },
    });
    expect(ref.settled, 'RK4 reached a periodic steady state').toBe(true);
    // Charge balance of the reference in steady state [derived]: the rectifier's mean current is the load.
    expectClose(ref.diodeMean, inputs.loadCurrent, 1e-3, 'RK4 charge balance');
    // Tolerances: two methods at different step sizes (here they agree to about 1e-6). Voltages within
    // 0.01 %; ripple (a small difference of large numbers) and the currents within 0.1 %; conduction,
    // which both measure by counting steps, within 1 %.
    expectClose(num(outputs, 'averageDc'), ref.averageDc, 1e-4, 'average DC');
    expectClose(num(outputs, 'maximumDc'), ref.maximum, 1e-4, 'crest');
    expectClose(num(outputs, 'minimumDc'), ref.minimum, 1e-4, 'trough');
    expectClose(num(outputs, 'ripplePeakToPeak'), ref.ripplePeakToPeak, 1e-3, 'ripple p-p');
    expectClose(num(outputs, 'rippleRms'), ref.rippleRms, 1e-3, 'ripple rms');
    expectClose(num(outputs, 'peakRectifierCurrent'), ref.peakDiodeCurrent, 1e-3, 'peak diode current');
    expectClose(num(outputs, 'capacitorRippleCurrent'), ref.capacitorRms, 1e-3, 'capacitor ripple current');
    expectClose(num(outputs, 'conduction') / 100, ref.conduction, 1e-2, 'conduction per half-cycle');
    // A bridge winding carries the rectifier current every half-cycle; each diode, and each half of a
    // centre-tapped winding, on alternate half-cycles: rms ÷ √2 [derived].
    const winding = inputs.rectifier === 'silicon-bridge' ? ref.halfCycleRms : ref.halfCycleRms / Math.SQRT2;
    expectClose(num(outputs, 'windingRmsCurrent'), winding, 1e-3, 'winding rms current');
    expectClose(
      num(outputs, 'rectifierRmsCurrent'),
      ref.halfCycleRms / Math.SQRT2,
      1e-3,
      'rectifier rms current',
    );
  });
});

describe('loaded-bplus', () => {
  it('ripple approximation I/(2fC): 100 mA, 50 Hz, 47 µF → 21.28 V [derived, docs/references.md §3; units by mathjs]', () => {
    // mathjs does the unit arithmetic: mA ÷ (Hz × µF) comes out in volts.
    const byUnits = divide(unit('100 mA'), multiply(2, multiply(unit('50 Hz'), unit('47 uF')))) as Unit;
    expectClose(byUnits.toNumber('V'), 21.28);
    expectClose(rippleApproxFullWave(0.1, 50, 47e-6), 21.28);
  });

  it('at light ripple: between I·t_off/C (t_off from the RK4 conduction time) and I/(2fC) [derived, docs/references.md §3]', () => {
    // 470 µF, 100 mA, 50 Hz: I/(2fC) = 2.128 V. While the rectifier is off the reservoir falls at
    // exactly I/C for t_off = (1 − conduction)/(2f); crest and trough lie inside the conduction time
    // (where the rectifier current equals I), so the ripple is at least I·t_off/C and at most I/(2fC).
    const inputs = {
      windingVoltage: '300 V',
      sourceResistance: '2R2',
      reservoir: '470 µF',
      mainsFrequency: '50 Hz',
      loadCurrent: '100 mA',
    };
    const { outputs } = run('loaded-bplus', inputs);
    const approx = 0.1 / (2 * 50 * 470e-6);
    const ripple = num(outputs, 'ripplePeakToPeak');
    const ref = solveByRk4({
      vPeak: Math.SQRT2 * 300,
      drop: 1.8,
      rs: 2.2,
      c: 470e-6,
      f: 50,
      load: { current: 0.1 },
    });
    const offTimeDrop = approx * (1 - ref.conduction);
    expect(ripple).toBeLessThanOrEqual(approx);
    expect(ripple).toBeGreaterThanOrEqual(offTimeDrop * (1 - 1e-4));
    // At light ripple the extra fall inside the conduction time is small: within 1 % of I·t_off/C.
    expectClose(ripple, offTimeDrop, 1e-2, 'ripple against I·t_off/C');
    // A sawtooth's rms is ΔV_pp / (2√3) [derived, docs/references.md §3]; the real wave's recharge
    // follows the sine, not a vertical edge, hence 5 %.
    expectClose(num(outputs, 'rippleRms'), offTimeDrop / (2 * Math.sqrt(3)), 0.05, 'sawtooth rms');
  });

  it('Schade’s small-R_s limit: full-wave E_dc/E_pk at ωCR_L = 100 is 0.9845, approached from above [derived, docs/references.md §3; Schade, Proc. IRE 1943]', () => {
    const f = 50;
    const C = 100e-6;
    const RL = 100 / (2 * Math.PI * f * C);
    const Epk = 100;
    const limit = 1 / (1 + Math.PI / (2 * 100));
    expectClose(limit, 0.9845, 1e-4);
    // The limit counts the recharge time as discharge. Ripple fraction r = π/(ωCR_L); the ideal
    // rectifier conducts for the angle θ = acos(1 − r) of each half-cycle, fraction c = θ/π. Over that
    // time the true wave sits above the limit's sawtooth by less than the ripple r·E_pk, and elsewhere
    // not below it, so the exact value lies in [limit, limit + c·r] [derived].
    const r = Math.PI / 100;
    const c = Math.acos(1 - r) / Math.PI;
    const honest = (ratio: number, what: string) => {
      expect(ratio, `${what} ≥ limit`).toBeGreaterThanOrEqual(limit);
      expect(ratio - limit, `${what} − limit ≤ c·r = ${(c * r).toFixed(5)}`).toBeLessThanOrEqual(c * r);
    };
    // Independent: resistive load R_L and R_s = 10⁻⁴ R_L, by RK4.
    const rk = solveByRk4({ vPeak: Epk, drop: 0, rs: RL * 1e-4, c: C, f, load: { resistance: RL } });
    expect(rk.settled).toBe(true);
    honest(rk.averageDc / Epk, 'RK4');
    // The reckoner takes a constant-current load: iterate I = E_dc / R_L to the resistive operating point.
    let Edc = Epk;
    for (let i = 0; i < 30; i++) {
      const out = run('loaded-bplus', {
        windingVoltage: Epk / Math.SQRT2,
        sourceResistance: RL * 1e-4,
        reservoir: C,
        mainsFrequency: f,
        loadCurrent: Edc / RL,
        rectifier: 'silicon-bridge',
        diodeDrop: 0,
      }).outputs;
      Edc = num(out, 'averageDc');
    }
    honest(Edc / Epk, 'reckoner');
    // A resistive load follows the ripple while the iterated constant current does not: allow 0.05 %.
    expectClose(Edc / Epk, rk.averageDc / Epk, 5e-4, 'reckoner against RK4');
  });

  it('with no load the reservoir sits at the peak less the drop, with no ripple [derived, docs/references.md §2]', () => {
    const { outputs } = run('loaded-bplus', {
      windingVoltage: 300,
      sourceResistance: 50,
      reservoir: '47u',
      loadCurrent: 0,
    });
    expectClose(num(outputs, 'averageDc'), Math.SQRT2 * 300 - 1.8, 1e-9);
    expect(num(outputs, 'ripplePeakToPeak')).toBe(0);
  });

  it('reports an overload as an error on loadCurrent, not NaN', () => {
    // 2 A from a 100 V winding through 100 Ω: even a short across the reservoir gives only 1.4 A peak.
    const errs = fieldErrors('loaded-bplus', {
      windingVoltage: 100,
      sourceResistance: 100,
      reservoir: '1u',
      loadCurrent: 2,
    });
    expect(errs[0]!.field).toBe('loadCurrent');
  });

  it('cautions about hazard (above 60 V DC, docs/references.md §8), stored charge, ripple current and rectifier peaks', () => {
    const { cautions } = run('loaded-bplus', {
      windingVoltage: 300,
      sourceResistance: 50,
      reservoir: '47u',
      loadCurrent: '0.1',
      rectifier: 'valve',
    });
    expect(cautions.map((c) => c.code)).toEqual(
      expect.arrayContaining([
        'hazardous-voltage',
        'stored-charge',
        'ripple-current',
        'rectifier-peak',
        'valve-rectifier-limits',
        'local-codes',
      ]),
    );
  });
});
