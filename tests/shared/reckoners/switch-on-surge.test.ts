import { describe, expect, it } from 'vitest';
import { expectClose, fieldErrors, num, run } from '../helpers';
import { simulateSwitchOn } from './switch-on-rk4';

const circuit = {
  windingVoltage: '300 V',
  mainsVoltage: '230 V',
  rectifier: 'silicon-bridge',
  diodeDrop: '1 V',
  secondaryResistance: '40 Ω',
  primaryResistance: '12 Ω',
  mainsFrequency: '50 Hz',
};
const reflected = 40 + 12 * (300 / 230) ** 2;

describe('switch-on surge', () => {
  it('the primary resistance is reflected by the turns ratio squared [referred impedance, docs/references.md §10]', () => {
    const { outputs } = run('switch-on-surge', { ...circuit, reservoir: '100 µF' });
    expectClose(num(outputs, 'sourceResistance'), reflected, 1e-12);
    expectClose(num(outputs, 'peakCurrent'), (Math.SQRT2 * 300 - 2) / reflected, 1e-12);
  });

  it('with a short time constant the exponential I²t matches the simulated switch-on within 3 % [derived by simulation]', () => {
    // τ = 61 Ω × 4.7 µF ≈ 0.3 ms, short against the 10 ms half-cycle.
    const { outputs } = run('switch-on-surge', { ...circuit, reservoir: '4.7 µF' });
    const sim = simulateSwitchOn({ vPeak: Math.SQRT2 * 300, drop: 2, rs: reflected, c: 4.7e-6, hz: 50 });
    expectClose(num(outputs, 'peakCurrent'), sim.peak, 1e-3);
    expectClose(num(outputs, 'diodeI2t'), sim.i2t, 0.03);
  });

  it('with a long time constant the exponential figure stays above the simulated one (it is an upper figure) [derived by simulation]', () => {
    const { outputs } = run('switch-on-surge', { ...circuit, reservoir: '470 µF' });
    const sim = simulateSwitchOn({ vPeak: Math.SQRT2 * 300, drop: 2, rs: reflected, c: 470e-6, hz: 50 });
    expect(num(outputs, 'diodeI2t')).toBeGreaterThan(sim.i2t);
  });

  it('the fuse sees the rectifier I²t scaled by the turns ratio squared, and a fuse below it is flagged [derived]', () => {
    const { outputs, cautions } = run('switch-on-surge', {
      ...circuit,
      reservoir: '220 µF',
      fuseI2t: '0.2 A²s',
    });
    expectClose(num(outputs, 'fuseI2tDemand'), num(outputs, 'diodeI2t') * (300 / 230) ** 2, 1e-12);
    expect(num(outputs, 'fuseI2tDemand')).toBeGreaterThan(0.2);
    expect(cautions.map((c) => c.code)).toContain('fuse-opens-on-surge');
    const big = run('switch-on-surge', { ...circuit, reservoir: '220 µF', fuseI2t: '500 A²s' });
    expect(big.cautions.map((c) => c.code)).not.toContain('fuse-opens-on-surge');
  });

  it('a diode surge rating below the peak is flagged; its I²t is one half-sine [I²t of a half-sine = I² t / 2, derived]', () => {
    const { outputs, cautions } = run('switch-on-surge', {
      ...circuit,
      reservoir: '100 µF',
      diodeSurge: '5 A',
    });
    expectClose(num(outputs, 'diodeSurgeI2t'), (5 * 5 * 0.01) / 2, 1e-12);
    expect(cautions.map((c) => c.code)).toContain('diode-surge');
  });

  it('without the winding resistances it falls back to the rule of thumb and says so [common practice, no source]', () => {
    const { outputs, cautions } = run('switch-on-surge', {
      windingVoltage: '300 V',
      reservoir: '100 µF',
      runningCurrent: '400 mA',
    });
    expect(outputs.method!.value).toBe('rule of thumb');
    expectClose(num(outputs, 'primaryPeak'), 4, 1e-12);
    expect(cautions.map((c) => c.code)).toContain('rule-of-thumb');
  });

  it('asks for the resistances or the running current', () => {
    expect(
      fieldErrors('switch-on-surge', { windingVoltage: '300 V', reservoir: '100 µF' }).map((e) => e.field),
    ).toContain('secondaryResistance');
  });
});
