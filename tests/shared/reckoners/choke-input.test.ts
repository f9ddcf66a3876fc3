import { describe, expect, it } from 'vitest';
import { expectClose, fieldErrors, num, run } from '../helpers';
import { simulateChokeInput } from './filter-sections-rk4';

const base = {
  windingVoltage: '350 V',
  rectifier: 'silicon-centre-tap',
  diodeDrop: '0 V',
  chokeResistance: '100 Ω',
  mainsFrequency: '50 Hz',
};

describe('choke-input filter', () => {
  it('the rectified average is 2√2/π of the rms winding voltage [derived: mean of |sin| by Simpson’s rule, docs/references.md §3]', () => {
    const N = 10_000;
    let sum = 0;
    for (let k = 0; k <= N; k++) {
      const weight = k === 0 || k === N ? 1 : k % 2 ? 4 : 2;
      sum += weight * Math.abs(Math.sin((Math.PI * k) / N));
    }
    const meanOfSine = sum / (3 * N); // (1/π) ∫₀^π |sin| dθ with h = π/N
    const { outputs } = run('choke-input', { ...base, chokeInductance: '10 H', loadCurrent: '100 mA' });
    expectClose(num(outputs, 'rectifiedAverage'), Math.SQRT2 * 350 * meanOfSine, 1e-6);
    expectClose(num(outputs, 'dcOutput'), Math.SQRT2 * 350 * meanOfSine - 0.1 * 100, 1e-6);
  });

  it('critical inductance is R_L/1130 at 60 Hz [ARRL Handbook rule for full-wave choke input, from memory; docs/references.md §3]', () => {
    const { outputs } = run('choke-input', {
      ...base,
      mainsFrequency: '60 Hz',
      chokeInductance: '10 H',
      chokeResistance: '0 Ω',
      loadCurrent: '100 mA',
    });
    const rLoad = num(outputs, 'dcOutput') / 0.1;
    expectClose(num(outputs, 'criticalInductance'), rLoad / 1130, 2e-3);
  });

  it('above the critical inductance the simulated choke conducts all the time, below it the current stops [derived by simulation, docs/references.md §3]', () => {
    const rLoad = 5000;
    const { outputs } = run('choke-input', {
      ...base,
      chokeResistance: '0 Ω',
      chokeInductance: '10 H',
      loadCurrent: `${(0.9003 * 350) / rLoad} A`,
    });
    const lCrit = num(outputs, 'criticalInductance');
    const common = { vRms: 350, f: 50, rSeries: 0, C: 100e-6, rLoad };
    expect(simulateChokeInput({ ...common, L: 1.3 * lCrit }).minCurrent).toBeGreaterThan(0);
    expect(simulateChokeInput({ ...common, L: 0.7 * lCrit }).minCurrent).toBe(0);
  });

  it('in conduction the simulated DC and ripple match the reckoner [derived by simulation; ripple within 10 %, the reckoner keeps only the 2f term]', () => {
    const rLoad = 3000;
    const dcGuess = (2 * Math.SQRT2 * 350) / Math.PI;
    const { outputs } = run('choke-input', {
      ...base,
      chokeInductance: '10 H',
      chokeResistance: '100 Ω',
      loadCurrent: `${dcGuess / (rLoad + 100)} A`,
      filterCapacitance: '47 µF',
    });
    const sim = simulateChokeInput({ vRms: 350, f: 50, L: 10, rSeries: 100, C: 47e-6, rLoad });
    expect(sim.minCurrent).toBeGreaterThan(0);
    expectClose(num(outputs, 'dcOutput'), sim.dc, 5e-3);
    expectClose(num(outputs, 'rippleRms'), sim.rippleRms, 0.1);
  });

  it('the least current and the critical inductance are one rule seen from both sides [derived]', () => {
    const { outputs } = run('choke-input', { ...base, chokeInductance: '8 H', loadCurrent: '120 mA' });
    const iMin = num(outputs, 'minimumCurrent');
    const lAtMin = (num(outputs, 'dcOutput') / iMin / (3 * 2 * Math.PI * 50)) as number;
    expectClose(lAtMin, 8, 1e-9);
  });

  it('a light load below the least current raises the caution and sizes a bleeder for the difference', () => {
    const { outputs, cautions } = run('choke-input', {
      ...base,
      chokeInductance: '4 H',
      loadCurrent: '150 mA',
      lightestLoad: '10 mA',
    });
    const iMin = num(outputs, 'minimumCurrent');
    expect(iMin).toBeGreaterThan(0.01);
    expect(cautions.map((c) => c.code)).toContain('light-load-soars');
    const bleeder = num(outputs, 'suggestedBleeder');
    // The E12 bleeder draws at least the shortfall at the DC output.
    expect(num(outputs, 'dcOutput') / bleeder).toBeGreaterThanOrEqual(iMin - 0.01 - 1e-12);
    expectClose(num(outputs, 'bleederExact'), num(outputs, 'dcOutput') / (iMin - 0.01), 1e-9);
  });

  it('warns when the LC resonance is near or above the ripple frequency [common practice, no source]', () => {
    const near = run('choke-input', {
      ...base,
      chokeInductance: '1 H',
      loadCurrent: '20 mA',
      filterCapacitance: '5 µF',
    });
    expect(num(near.outputs, 'resonance')).toBeGreaterThan(50);
    expect(near.cautions.map((c) => c.code)).toContain('resonance-near-ripple');
    const far = run('choke-input', {
      ...base,
      chokeInductance: '10 H',
      loadCurrent: '100 mA',
      filterCapacitance: '47 µF',
    });
    expect(far.cautions.map((c) => c.code)).not.toContain('resonance-near-ripple');
  });

  it('the no-load output is the peak less the rectifier drop, and it is flagged as hazardous', () => {
    const { outputs, cautions } = run('choke-input', {
      ...base,
      diodeDrop: '1 V',
      chokeInductance: '10 H',
      loadCurrent: '100 mA',
    });
    expectClose(num(outputs, 'noLoadPeak'), Math.SQRT2 * 350 - 1, 1e-9);
    expect(cautions.find((c) => c.code === 'hazardous-voltage')?.level).toBe('danger');
  });

  it('refuses a valve rectifier without its drop and a lightest load above the load', () => {
    expect(
      fieldErrors('choke-input', {
        ...base,
        rectifier: 'valve',
        chokeInductance: '10 H',
        loadCurrent: '0.1',
      }).map((e) => e.field),
    ).toContain('valveDrop');
    expect(
      fieldErrors('choke-input', {
        ...base,
        chokeInductance: '10 H',
        loadCurrent: '100 mA',
        lightestLoad: '200 mA',
      }).map((e) => e.field),
    ).toContain('lightestLoad');
  });
});
