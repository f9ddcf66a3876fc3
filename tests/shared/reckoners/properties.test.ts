/** Property-based checks (fast-check). */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { runReckoner } from '../../../shared/reckoners/validate';
import type { Output } from '../../../shared/reckoners/types';

function allFinite(outputs: Record<string, Output>): boolean {
  return Object.values(outputs).every((o) => typeof o.value !== 'number' || Number.isFinite(o.value));
}

/** Either finite outputs, or errors that each name a field and a reason — never NaN or Infinity. */
function expectFiniteOrNamedError(kind: string, input: unknown) {
  const r = runReckoner(kind, input);
  if (r.ok) {
    expect(allFinite(r.outputs), JSON.stringify(input)).toBe(true);
    for (const o of Object.values(r.outputs)) expect(o.formatted).not.toMatch(/NaN|Infinity/);
  } else {
    for (const e of r.errors) {
      expect(e.field.length).toBeGreaterThan(0);
      expect(e.reason.length).toBeGreaterThan(0);
    }
  }
}

const volts = (min: number, max: number) => fc.double({ min, max, noNaN: true });
const rectifier = fc.constantFrom('silicon-bridge', 'silicon-centre-tap', 'valve');

const loadedArb = fc.record({
  windingVoltage: volts(5, 1000),
  sourceResistance: fc.double({ min: 0.1, max: 2000, noNaN: true }),
  reservoir: fc.double({ min: 1e-6, max: 4.7e-3, noNaN: true }),
  mainsFrequency: fc.constantFrom(50, 60),
  loadCurrent: fc.double({ min: 0, max: 0.5, noNaN: true }),
  rectifier,
  diodeDrop: fc.double({ min: 0, max: 1.2, noNaN: true }),
  valveDrop: fc.double({ min: 0, max: 30, noNaN: true }),
});

describe('outputs are finite for every valid input', () => {
  it('mains-fuse', () => {
    fc.assert(
      fc.property(
        fc.array(fc.record({ volts: volts(0.5, 1000), amps: fc.double({ min: 0.001, max: 10, noNaN: true }) }), { minLength: 1, maxLength: 6 }),
        volts(50, 300),
        fc.double({ min: 30, max: 100, noNaN: true }),
        fc.double({ min: 1, max: 3, noNaN: true }),
        (windings, mainsVoltage, efficiency, margin) => expectFiniteOrNamedError('mains-fuse', { windings, mainsVoltage, efficiency, margin }),
      ),
      { numRuns: 300 },
    );
  });
  it('peak-no-load', () => {
    fc.assert(
      fc.property(volts(0.1, 3000), volts(50, 300), volts(50, 300), rectifier, fc.double({ min: 0, max: 200, noNaN: true }), (w, nom, act, rect, drop) =>
        expectFiniteOrNamedError('peak-no-load', { windingVoltage: w, mainsNominal: nom, mainsActual: act, rectifier: rect, valveDrop: drop }),
      ),
      { numRuns: 300 },
    );
  });
  it('loaded-bplus', () => {
    fc.assert(fc.property(loadedArb, (inp) => expectFiniteOrNamedError('loaded-bplus', inp)), { numRuns: 150 });
  });
  it('dropper-ladder', () => {
    fc.assert(
      fc.property(
        volts(10, 3000),
        fc.array(fc.record({ frac: fc.double({ min: 0.01, max: 0.99, noNaN: true }), current: fc.double({ min: 1e-4, max: 0.2, noNaN: true }), capacitance: fc.double({ min: 1e-7, max: 1e-3, noNaN: true }) }), { minLength: 1, maxLength: 6 }),
        (start, rows) => {
          let v = start;
          const stages = rows.map((r) => {
            v = v * r.frac;
            return { targetVoltage: v, current: r.current, capacitance: r.capacitance };
          });
          expectFiniteOrNamedError('dropper-ladder', { startVoltage: start, stages, startRipple: 5 });
        },
      ),
      { numRuns: 300 },
    );
  });
  it('bleeder', () => {
    fc.assert(
      fc.property(fc.double({ min: 1e-9, max: 1, noNaN: true }), volts(0.1, 5000), fc.double({ min: 1, max: 1e9, noNaN: true }), volts(1, 1000), (c, v, r, th) =>
        expectFiniteOrNamedError('bleeder', { capacitance: c, chargedVoltage: v, bleederResistance: r, threshold: th }),
      ),
      { numRuns: 300 },
    );
  });
  it('heater-budget', () => {
    fc.assert(
      fc.property(
        fc.array(fc.record({ volts: volts(1, 100), amps: fc.double({ min: 0.01, max: 5, noNaN: true }), count: fc.integer({ min: 1, max: 10 }) }), { minLength: 1, maxLength: 8 }),
        fc.constantFrom('parallel', 'series'),
        volts(1, 300),
        fc.double({ min: 0.01, max: 50, noNaN: true }),
        (heaters, arrangement, wv, wc) => expectFiniteOrNamedError('heater-budget', { heaters, arrangement, windingVoltage: wv, windingCurrent: wc }),
      ),
      { numRuns: 300 },
    );
  });
  it('reading-tolerance', () => {
    fc.assert(
      fc.property(fc.double({ min: -1e4, max: 1e4, noNaN: true }), fc.double({ min: 0, max: 100, noNaN: true }), fc.double({ min: -1e4, max: 1e4, noNaN: true }), (e, p, m) =>
        expectFiniteOrNamedError('reading-tolerance', { expected: e, tolerance: { kind: 'percent', percent: p }, measured: m }),
      ),
      { numRuns: 300 },
    );
  });
});

function bplus(inp: Record<string, unknown>) {
  const r = runReckoner('loaded-bplus', inp);
  return r.ok ? r.outputs : null;
}

describe('physical monotonicity', () => {
  it('more load current never raises loaded B+', () => {
    fc.assert(
      fc.property(loadedArb, fc.double({ min: 0, max: 0.5, noNaN: true }), (inp, other) => {
        const [lo, hi] = [Math.min(inp.loadCurrent, other), Math.max(inp.loadCurrent, other)];
        const a = bplus({ ...inp, loadCurrent: lo });
        const b = bplus({ ...inp, loadCurrent: hi });
        fc.pre(a !== null && b !== null);
        expect(b!.averageDc!.value as number).toBeLessThanOrEqual((a!.averageDc!.value as number) * (1 + 1e-9));
      }),
      { numRuns: 120 },
    );
  });

  it('more reservoir capacitance never raises ripple', () => {
    fc.assert(
      fc.property(loadedArb, fc.double({ min: 1e-6, max: 4.7e-3, noNaN: true }), (inp, other) => {
        const [lo, hi] = [Math.min(inp.reservoir, other), Math.max(inp.reservoir, other)];
        const a = bplus({ ...inp, reservoir: lo });
        const b = bplus({ ...inp, reservoir: hi });
        fc.pre(a !== null && b !== null);
        const ra = a!.ripplePeakToPeak!.value as number;
        const rb = b!.ripplePeakToPeak!.value as number;
        expect(rb).toBeLessThanOrEqual(ra * (1 + 1e-6) + 1e-9);
      }),
      { numRuns: 120 },
    );
  });

  it('a larger bleeder never discharges faster', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1e-9, max: 1, noNaN: true }),
        volts(0.1, 5000),
        fc.double({ min: 1, max: 1e9, noNaN: true }),
        fc.double({ min: 1, max: 1e9, noNaN: true }),
        (c, v, r1, r2) => {
          const [lo, hi] = [Math.min(r1, r2), Math.max(r1, r2)];
          const t = (r: number) => {
            const res = runReckoner('bleeder', { capacitance: c, chargedVoltage: v, bleederResistance: r });
            if (!res.ok) throw new Error(JSON.stringify(res.errors));
            return res.outputs.timeToThreshold!.value as number;
          };
          expect(t(hi)).toBeGreaterThanOrEqual(t(lo));
        },
      ),
      { numRuns: 300 },
    );
  });
});
