import { describe, expect, it } from 'vitest';
import { expectClose, fieldErrors, num, run } from '../helpers';
import { simulateChokeInput } from './filter-sections-rk4';
import { solveByRk4 } from './capacitor-input-rk4';

const supply = {
  windingVoltage: '300 V',
  highMains: '10 %',
  unloadedRise: '10 %',
  rectifier: 'silicon-bridge',
  diodeDrop: '1 V',
  sourceResistance: '60 Ω',
  mainsFrequency: '50 Hz',
  loadCurrent: '150 mA',
  reservoir: '100 µF',
};

describe('part ratings at high mains', () => {
  it('a 450 V capacitor on a 300 V winding is under-rated at +10 % mains with no load [√2 × 300 × 1.1 × 1.1 − 2 = 511.4 V; docs/references.md §2]', () => {
    const { outputs, cautions } = run('part-ratings', {
      ...supply,
      capacitors: [{ label: 'Reservoir', rating: '450 V' }, { rating: '630 V' }],
    });
    expectClose(num(outputs, 'noLoadPeakHigh'), Math.SQRT2 * 300 * 1.21 - 2, 1e-12);
    const under = cautions.filter((c) => c.code === 'capacitor-under-rated');
    expect(under.map((c) => c.field)).toEqual(['capacitors.0.rating']);
    expect(under[0]!.level).toBe('danger');
    expectClose(num(outputs, 'capacitor2.margin'), 630 - (Math.SQRT2 * 300 * 1.21 - 2), 1e-12);
  });

  it('the reservoir ripple current at high mains agrees with an RK4 integration of the circuit within 2 % [docs/references.md §3, §7]', () => {
    const { outputs } = run('part-ratings', supply);
    const rk4 = solveByRk4({
      vPeak: Math.SQRT2 * 300 * 1.1,
      drop: 2,
      rs: 60,
      c: 100e-6,
      f: 50,
      load: { current: 0.15 },
      stepsPerHalfCycle: 4000,
    });
    expectClose(num(outputs, 'reservoirRippleCurrent'), rk4.capacitorRms, 0.02);
    const rated = run('part-ratings', { ...supply, reservoirRippleRating: `${rk4.capacitorRms * 0.8} A` });
    expect(rated.cautions.map((c) => c.code)).toContain('ripple-current');
  });

  it('resistors: dissipation against the derated rating and the voltage at switch-on against the element limit', () => {
    const { outputs, cautions } = run('part-ratings', {
      ...supply,
      resistorDerating: '50 %',
      resistors: [
        { label: 'R1', resistance: '2k2', current: '50 mA', powerRating: '5 W', voltageLimit: '350 V' },
        { label: 'R2', resistance: '10k', current: '5 mA', powerRating: '1 W' },
      ],
    });
    expectClose(num(outputs, 'resistor1.dissipation'), 0.05 * 0.05 * 2200, 1e-12);
    expect(outputs['resistor1.withinDerating']!.value).toBe(false);
    expect(outputs['resistor2.withinDerating']!.value).toBe(true);
    const fields = cautions.map((c) => c.field);
    expect(fields).toContain('resistors.0.powerRating');
    expect(fields).toContain('resistors.0.voltageLimit');
    expect(fields).not.toContain('resistors.1.powerRating');
  });

  it('diodes: reverse voltage of a centre tap is 2√2 × the half-winding at high mains, unloaded [derived; docs/references.md §2]', () => {
    const { outputs, cautions } = run('part-ratings', {
      ...supply,
      rectifier: 'silicon-centre-tap',
      diodePiv: '1000 V',
      diodeSurge: '5 A',
    });
    expectClose(num(outputs, 'diodePiv'), 2 * Math.SQRT2 * 300 * 1.1 * 1.1, 1e-12);
    const codes = cautions.map((c) => c.code);
    expect(codes).toContain('diode-piv');
    expect(codes).toContain('diode-surge');
  });
});

describe('part ratings at high mains: choke input', () => {
  // 300 V bridge winding, 10 H input choke and 100 µF after it, 150 mA: well above the critical
  // current (V_dc ÷ 3ωL ≈ 290 V ÷ 9.4 kΩ ≈ 31 mA).
  const choke = { ...supply, filter: 'choke', inputChoke: '10 H' };
  const high = 300 * 1.1;

  it('the capacitor after the choke still must stand the no-load peak: below the critical current the output rises toward it [docs/references.md §3]', () => {
    const { outputs } = run('part-ratings', { ...choke, capacitors: [{ rating: '450 V' }] });
    expectClose(num(outputs, 'noLoadPeakHigh'), Math.SQRT2 * 300 * 1.21 - 2, 1e-12);
    // Loaded, a choke-input supply sits near 0.9 × rms: 2√2/π × 330 V less the drops.
    expectClose(num(outputs, 'loadedOutputHigh'), ((2 * Math.SQRT2) / Math.PI) * high - 2 - 0.15 * 60, 1e-9);
    // Simulated with no load to speak of (10 MΩ) the capacitor creeps up to the peak (98.5 % after 30 s).
    const idle = simulateChokeInput({
      vRms: high,
      drop: 2,
      f: 50,
      L: 10,
      rSeries: 60,
      C: 100e-6,
      rLoad: 1e7,
      cycles: 1500,
      stepsPerCycle: 1000,
    });
    expect(idle.dc).toBeGreaterThan(0.97 * (Math.SQRT2 * high - 2));
  });

  it('the ripple current in the capacitor after the choke agrees with an RK4 integration within 5 %, and is far below the capacitor-input figure [docs/references.md §3, §7]', () => {
    const { outputs, cautions } = run('part-ratings', choke);
    const sim = simulateChokeInput({
      vRms: high,
      drop: 2,
      f: 50,
      L: 10,
      rSeries: 60,
      C: 100e-6,
      rLoad: num(outputs, 'loadedOutputHigh') / 0.15,
    });
    expect(sim.minCurrent, 'the choke conducts all the time').toBeGreaterThan(0);
    expectClose(num(outputs, 'reservoirRippleCurrent'), sim.capacitorRms, 0.05);
    const capInput = run('part-ratings', supply);
    expect(num(outputs, 'reservoirRippleCurrent')).toBeLessThan(
      num(capInput.outputs, 'reservoirRippleCurrent') / 5,
    );
    expect(cautions.map((c) => c.code)).not.toContain('below-critical');
  });

  it('below the critical current the block says the capacitor charges toward the peak [docs/references.md §3]', () => {
    const { cautions } = run('part-ratings', { ...choke, loadCurrent: '10 mA' });
    expect(cautions.find((c) => c.code === 'below-critical')?.level).toBe('warning');
  });

  it('the diodes’ switch-on surge is held by the choke: at most V_pk √(C/L) and V_pk ÷ R, and the simulated switch-on stays under it [derived; docs/references.md §3]', () => {
    const { outputs } = run('part-ratings', choke);
    const sim = simulateChokeInput({
      vRms: high,
      drop: 2,
      f: 50,
      L: 10,
      rSeries: 60,
      C: 100e-6,
      rLoad: 1e7,
      fromRest: true,
      cycles: 20,
    });
    const bound = num(outputs, 'diodeSurgePeak');
    expectClose(bound, (Math.SQRT2 * high - 2) * Math.sqrt(100e-6 / 10), 1e-9);
    expect(sim.peakCurrent).toBeLessThanOrEqual(bound);
    expect(sim.peakCurrent, 'the bound is not loose').toBeGreaterThan(0.4 * bound);
  });

  it('a choke-input filter needs the choke', () => {
    expect(fieldErrors('part-ratings', { ...supply, filter: 'choke' }).map((e) => e.field)).toContain(
      'inputChoke',
    );
  });
});
