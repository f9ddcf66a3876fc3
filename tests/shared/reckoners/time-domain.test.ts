/**
 * The filter reckoners against an independent time-domain integration of the same circuit (RK4,
 * docs/references.md §3, §7), across a grid of loads and capacitances. The reckoners solve by other
 * means — an exact exponential per step with a root search for the periodic state (loaded B+), the
 * rectified average and its 2f Fourier term (choke input), a closed-form attenuation (dropper
 * stages) — so agreement is not a restatement of one formula. Each tolerance is stated where it is
 * checked (observed agreement is about ten times closer), with what the reckoner leaves out.
 */
import { describe, expect, it } from 'vitest';
import { expectClose, num, run } from '../helpers';
import { solveByRk4 } from './capacitor-input-rk4';
import { simulateChokeInput, simulateSection } from './filter-sections-rk4';

const grid = <A, B>(as: readonly A[], bs: readonly B[]) => as.flatMap((a) => bs.map((b) => [a, b] as const));

describe('loaded B+ (capacitor input) against RK4', () => {
  // A 300 V winding into a silicon bridge through 40 Ω, 50 Hz; constant-current loads.
  const loads = [0.03, 0.1, 0.25] as const;
  const reservoirs = [22e-6, 100e-6, 470e-6] as const;

  it.each(grid(loads, reservoirs))(
    '%s A from %s F: DC within 0.001 %, ripple and reservoir ripple current within 0.01 %',
    (load, c) => {
      const { outputs } = run('loaded-bplus', {
        windingVoltage: 300,
        sourceResistance: 40,
        reservoir: c,
        mainsFrequency: 50,
        loadCurrent: load,
        rectifier: 'silicon-bridge',
        diodeDrop: 0.9,
      });
      const ref = solveByRk4({
        vPeak: Math.SQRT2 * 300,
        drop: 1.8,
        rs: 40,
        c,
        f: 50,
        load: { current: load },
        stepsPerHalfCycle: 4000,
        settleTolerance: 1e-8,
      });
      expect(ref.settled, 'RK4 reached a periodic steady state').toBe(true);
      expectClose(ref.diodeMean, load, 1e-3, 'RK4 charge balance');
      expectClose(num(outputs, 'averageDc'), ref.averageDc, 1e-5, 'average DC');
      expectClose(num(outputs, 'ripplePeakToPeak'), ref.ripplePeakToPeak, 1e-4, 'ripple p-p');
      expectClose(num(outputs, 'rippleRms'), ref.rippleRms, 1e-4, 'ripple rms');
      expectClose(num(outputs, 'capacitorRippleCurrent'), ref.capacitorRms, 1e-4, 'reservoir ripple current');
    },
  );
});

describe('choke-input filter in conduction against RK4', () => {
  // 350 V into a silicon bridge (0.9 V per diode), a 15 H choke with 100 Ω, a resistive load; 50 and
  // 60 Hz alternate through the grid. 15 H is above the critical inductance of every load here.
  const loadResistances = [1500, 3000, 6000] as const;
  const capacitors = [22e-6, 47e-6, 100e-6] as const;

  it.each(grid(loadResistances, capacitors))(
    '%s Ω load, %s F: DC within 1e-6, ripple within 1 % (the reckoner keeps only the 2f term)',
    (rLoad, c) => {
      const f = (rLoad + c * 1e6) % 2 ? 60 : 50;
      const average = ((2 * Math.SQRT2) / Math.PI) * 350 - 1.8;
      // The reckoner takes a constant load current: the one this resistor draws at the output.
      const { outputs } = run('choke-input', {
        windingVoltage: 350,
        rectifier: 'silicon-bridge',
        diodeDrop: 0.9,
        chokeInductance: 15,
        chokeResistance: 100,
        loadCurrent: average / (rLoad + 100),
        mainsFrequency: f,
        filterCapacitance: c,
      });
      const sim = simulateChokeInput({ vRms: 350, drop: 1.8, f, L: 15, rSeries: 100, C: c, rLoad });
      expect(sim.minCurrent, 'the simulated choke conducts all the time').toBeGreaterThan(0);
      expect(num(outputs, 'criticalInductance')).toBeLessThan(15);
      expectClose(num(outputs, 'dcOutput'), sim.dc, 1e-6, 'DC output');
      expectClose(num(outputs, 'rippleRms'), sim.rippleRms, 0.01, 'ripple rms');
    },
  );
});

describe('dropper-ladder sections against RK4', () => {
  // 350 V with 5 V peak-to-peak of 100 Hz ripple (50 Hz mains, full-wave) into one section.
  const start = { startVoltage: 350, startRipple: 5, mainsFrequency: 50 };

  const chokes = [2, 5, 10] as const;
  const capacitors = [10e-6, 47e-6, 100e-6] as const;
  it.each(grid(chokes, capacitors))(
    'LC: %s H, 150 Ω, %s F at 40 mA: node DC within 1e-6, ripple within 2 % (the reckoner leaves out the choke’s resistance)',
    (l, c) => {
      const { outputs } = run('dropper-ladder', {
        ...start,
        stages: [
          {
            targetVoltage: 340,
            current: 0.04,
            capacitance: c,
            element: 'choke',
            inductance: l,
            fittedResistance: 150,
          },
        ],
      });
      const sim = simulateSection({
        vIn: 350,
        ripplePeakToPeak: 5,
        fRipple: 100,
        L: l,
        R: 150,
        C: c,
        load: 0.04,
      });
      expectClose(num(outputs, 'stage1.nodeVoltage'), sim.dc, 1e-6, 'node DC');
      expectClose(num(outputs, 'stage1.ripple'), sim.ripplePeakToPeak, 0.02, 'node ripple');
    },
  );

  const resistors = [1000, 4700, 22000] as const;
  it.each(grid(resistors, [10e-6, 47e-6] as const))(
    'RC: %s Ω, %s F at 5 mA: node DC within 1e-6, ripple within 0.01 %',
    (r, c) => {
      const { outputs } = run('dropper-ladder', {
        ...start,
        stages: [{ targetVoltage: 340, current: 0.005, capacitance: c, fittedResistance: r }],
      });
      const sim = simulateSection({
        vIn: 350,
        ripplePeakToPeak: 5,
        fRipple: 100,
        L: 0,
        R: r,
        C: c,
        load: 0.005,
      });
      expectClose(num(outputs, 'stage1.nodeVoltage'), sim.dc, 1e-6, 'node DC');
      expectClose(num(outputs, 'stage1.ripple'), sim.ripplePeakToPeak, 1e-4, 'node ripple');
    },
  );
});
