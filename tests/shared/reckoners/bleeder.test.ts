import { describe, expect, it } from 'vitest';
import { divide, multiply, pow, unit, type Unit } from 'mathjs';
import { expectClose, fieldErrors, num, run } from '../helpers';

/**
 * The discharge of C through R, integrated step by step (classical RK4, docs/references.md §5, §7)
 * rather than through the closed form: when v first falls to `vt`, and the energy ∫ v²/R dt the
 * resistor takes over the whole discharge.
 */
function dischargeByRk4(r: number, c: number, v0: number, vt: number) {
  const tau = r * c;
  const h = tau / 2000;
  const slope = (v: number) => -v / tau;
  let v = v0;
  let t = 0;
  let crossing = Number.NaN;
  let energy = 0;
  while (v > v0 * 1e-9) {
    const k1 = slope(v);
    const k2 = slope(v + (h / 2) * k1);
    const k3 = slope(v + (h / 2) * k2);
    const k4 = slope(v + h * k3);
    const next = v + (h / 6) * (k1 + 2 * k2 + 2 * k3 + k4);
    energy += (h / 2) * ((v * v) / r + (next * next) / r); // trapezoid
    if (Number.isNaN(crossing) && next <= vt) crossing = t + (h * (v - vt)) / (v - next);
    v = next;
    t += h;
  }
  return { crossing, energy };
}

describe('bleeder', () => {
  it('100 µF at 450 V stores 10.13 J and 45 mC [derived, docs/references.md §5; units by mathjs: µF × V² → J, µF × V → mC]', () => {
    const { outputs } = run('bleeder', { capacitance: '100u', chargedVoltage: '450 V' });
    expectClose(num(outputs, 'storedEnergy'), 10.13, 1e-3);
    const energy = divide(multiply(unit('100 uF'), pow(unit('450 V'), 2) as Unit) as Unit, 2) as Unit;
    expectClose(num(outputs, 'storedEnergy'), energy.toNumber('J'), 1e-12);
    const charge = multiply(unit('100 uF'), unit('450 V')) as Unit;
    expectClose(num(outputs, 'storedCharge') * 1000, charge.toNumber('mC'), 1e-12);
  });

  it('the stored energy is what a bleeder dissipates over a full discharge [derived: energy conservation, docs/references.md §5]', () => {
    const { outputs } = run('bleeder', {
      capacitance: '100 µF',
      chargedVoltage: 450,
      bleederResistance: '22k',
    });
    expectClose(num(outputs, 'storedEnergy'), dischargeByRk4(22e3, 100e-6, 450, 60).energy, 1e-4);
  });

  it('450 V → 60 V in 5 s with 100 µF needs R ≤ 24.82 kΩ, and a step-by-step discharge through it takes 5 s [derived, docs/references.md §5; threshold and time std: IEC 60204-1 6.2.4]', () => {
    const { outputs } = run('bleeder', { capacitance: '100u', chargedVoltage: 450 });
    expectClose(num(outputs, 'maxBleeder'), 24820, 1e-3);
    expectClose(dischargeByRk4(num(outputs, 'maxBleeder'), 100e-6, 450, 60).crossing, 5, 1e-4);
    expect(num(outputs, 'suggestedBleeder')).toBe(22000); // E12 at or below 24.82 kΩ [std: IEC 60063, docs/references.md §4]
  });

  it('time constant (kΩ × µF → s by mathjs) and time to threshold (step-by-step discharge) [derived, docs/references.md §5, §7]', () => {
    const { outputs, cautions } = run('bleeder', {
      capacitance: '100 µF',
      chargedVoltage: 450,
      bleederResistance: '22k',
    });
    const tau = multiply(unit('22 kohm'), unit('100 uF')) as Unit;
    expectClose(num(outputs, 'timeConstant'), tau.toNumber('s'), 1e-12);
    const t = dischargeByRk4(22e3, 100e-6, 450, 60).crossing;
    expectClose(num(outputs, 'timeToThreshold'), t, 1e-4);
    expect(t).toBeLessThan(5);
    // V² ÷ R at the charged voltage: 450² / 22 000 = 9.205 W [derived]
    expectClose(num(outputs, 'bleederDissipation'), 9.2045, 1e-4);
    expect(cautions.some((c) => c.code === 'slow-discharge')).toBe(false);
    expect(cautions.some((c) => c.code === 'verify-discharge')).toBe(true);
  });

  it('flags a bleeder that is too slow for the target time: 220 kΩ × 100 µF takes 44 s [derived; std: IEC 60204-1 6.2.4, docs/references.md §8]', () => {
    const { cautions } = run('bleeder', {
      capacitance: '100 µF',
      chargedVoltage: 450,
      bleederResistance: '220k',
    });
    expect(cautions.find((c) => c.code === 'slow-discharge')?.source).toMatch(/IEC 60204-1/);
  });

  it('uses the threshold the author sets (50 V: NFPA 70E / OSHA 1910.333 [std, docs/references.md §8])', () => {
    const at60 = num(
      run('bleeder', { capacitance: '100u', chargedVoltage: 450, bleederResistance: '22k' }).outputs,
      'timeToThreshold',
    );
    const at50 = num(
      run('bleeder', {
        capacitance: '100u',
        chargedVoltage: 450,
        bleederResistance: '22k',
        threshold: '50 V',
      }).outputs,
      'timeToThreshold',
    );
    // Falling on from 60 V to 50 V takes the step-by-step discharge's extra time [derived, docs/references.md §5].
    const extra =
      dischargeByRk4(22e3, 100e-6, 450, 50).crossing - dischargeByRk4(22e3, 100e-6, 450, 60).crossing;
    expectClose(at50 - at60, extra, 1e-3);
  });

  it('needs no bleeder when already at or below the threshold [derived]', () => {
    const { outputs } = run('bleeder', {
      capacitance: '100u',
      chargedVoltage: 50,
      bleederResistance: '100k',
    });
    expect(num(outputs, 'timeToThreshold')).toBe(0);
    expect(typeof outputs.suggestedBleeder!.value).toBe('string');
  });

  it('warns above the 45 µC charge limit: 1 µF × 100 V = 100 µC warns, 100 nF × 100 V = 10 µC does not [std: IEC 61010-1, partly from memory; docs/references.md §8]', () => {
    expect(
      run('bleeder', { capacitance: '1u', chargedVoltage: 100 }).cautions.some(
        (c) => c.code === 'stored-charge-limit',
      ),
    ).toBe(true);
    expect(
      run('bleeder', { capacitance: '100n', chargedVoltage: 100 }).cautions.some(
        (c) => c.code === 'stored-charge-limit',
      ),
    ).toBe(false);
  });
});

describe('bleeder over time', () => {
  it('the voltage after a given time and the time to each further threshold match a step-by-step discharge [RK4, docs/references.md §5, §7]', () => {
    const { outputs } = run('bleeder', {
      capacitance: '220 µF',
      chargedVoltage: '480 V',
      bleederResistance: '100k',
      elapsed: '30 s',
      milestones: [{ label: 'probe on', volts: '10 V' }, { volts: '2 V' }],
    });
    expectClose(num(outputs, 'milestone1'), dischargeByRk4(100e3, 220e-6, 480, 10).crossing, 1e-4);
    expectClose(num(outputs, 'milestone2'), dischargeByRk4(100e3, 220e-6, 480, 2).crossing, 1e-4);
    expect(outputs.milestone1!.label).toContain('probe on');
    // The voltage at 30 s is the threshold whose crossing time is 30 s.
    const v30 = num(outputs, 'voltageAfter');
    expectClose(dischargeByRk4(100e3, 220e-6, 480, v30).crossing, 30, 1e-4);
  });

  it('asks for the bleeder resistance when the voltage over time is wanted', () => {
    expect(
      fieldErrors('bleeder', { capacitance: '100 µF', chargedVoltage: '450 V', elapsed: '10 s' }).map(
        (e) => e.field,
      ),
    ).toContain('bleederResistance');
  });
});
