/** Property-based checks (fast-check). */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { runReckoner } from '../../../shared/reckoners/validate';
import { listReckoners } from '../../../shared/reckoners/registry';
import type { Output } from '../../../shared/reckoners/types';
import { expectClose } from '../helpers';
import { WORKED_EXAMPLES } from './examples';

function allFinite(outputs: Record<string, Output>): boolean {
  return Object.values(outputs).every((o) => typeof o.value !== 'number' || Number.isFinite(o.value));
}

/** Either finite outputs, or errors that each name a field and a reason — never NaN or Infinity. Returns ok. */
function expectFiniteOrNamedError(kind: string, input: unknown): boolean {
  const r = runReckoner(kind, input);
  if (r.ok) {
    expect(allFinite(r.outputs), JSON.stringify(input)).toBe(true);
    for (const o of Object.values(r.outputs)) expect(o.formatted).not.toMatch(/NaN|Infinity/);
  } else {
    expect(r.errors.length).toBeGreaterThan(0);
    for (const e of r.errors) {
      expect(e.field.length).toBeGreaterThan(0);
      expect(e.reason.length).toBeGreaterThan(0);
    }
  }
  return r.ok;
}

describe('every registered reckoner evaluates its worked example [docs/references.md §1–§6]', () => {
  it('has a worked example for every kind in the registry', () => {
    expect(Object.keys(WORKED_EXAMPLES).sort()).toEqual(
      listReckoners()
        .map((d) => d.kind)
        .sort(),
    );
  });

  it.each(listReckoners().map((d) => d.kind))(
    '%s: ok, finite numeric outputs, and the hand-worked value',
    (kind) => {
      const example = WORKED_EXAMPLES[kind];
      expect(example, `a worked example for ${kind}`).toBeDefined();
      const r = runReckoner(kind, example!.inputs);
      if (!r.ok) throw new Error(`${kind} refused its worked example: ${JSON.stringify(r.errors)}`);
      const numeric = Object.values(r.outputs).filter((o) => typeof o.value === 'number');
      expect(numeric.length).toBeGreaterThan(0);
      expect(allFinite(r.outputs)).toBe(true);
      const { key, value, source } = example!.check;
      expect(typeof r.outputs[key]?.value, `${kind}.${key}`).toBe('number');
      expectClose(r.outputs[key]!.value as number, value, 1e-3, `${kind}.${key} (${source})`);
    },
  );
});

const range = (min: number, max: number) => fc.double({ min, max, noNaN: true });
const rectifier = fc.constantFrom('silicon-bridge', 'silicon-centre-tap', 'valve');

/**
 * Realistic inputs, mostly valid: each property also requires that at least MIN_OK of the generated
 * inputs evaluate, so a reckoner that refused everything would fail.
 */
const MIN_OK = 0.9;

const arbitraries: Record<string, fc.Arbitrary<Record<string, unknown>>> = {
  'mains-fuse': fc.record({
    windings: fc.array(fc.record({ volts: range(5, 450), amps: range(0.01, 0.5) }), {
      minLength: 1,
      maxLength: 4,
    }),
    mainsVoltage: range(100, 250),
    efficiency: range(70, 95),
    margin: range(1, 2),
    series: fc.constantFrom('iec', 'north-american'),
    inrushMultiple: range(1, 20),
    inrushDuration: range(0.01, 0.5),
  }),
  'peak-no-load': fc.record({
    windingVoltage: range(5, 600),
    windingBasis: fc.constantFrom('nominal', 'measured'),
    mainsNominal: range(100, 250),
    mainsActual: range(90, 270),
    rectifier,
    diodeDrop: range(0.5, 1.2),
    valveDrop: range(0, 60),
    unloadedRise: range(0, 15),
    filterNodes: fc.integer({ min: 1, max: 5 }),
  }),
  'loaded-bplus': fc.record({
    windingVoltage: range(100, 500),
    sourceResistance: range(1, 300),
    reservoir: range(10e-6, 1e-3),
    mainsFrequency: fc.constantFrom(50, 60),
    loadCurrent: range(0, 0.3),
    rectifier,
    diodeDrop: range(0.6, 1.1),
    valveDrop: range(0, 40),
  }),
  'dropper-ladder': fc
    .record({
      start: range(100, 600),
      series: fc.constantFrom('E12', 'E24'),
      startRipple: range(0, 10),
      rows: fc.array(
        fc.record({ frac: range(0.7, 0.97), current: range(1e-3, 0.03), capacitance: range(1e-6, 100e-6) }),
        { minLength: 1, maxLength: 4 },
      ),
    })
    .map(({ start, series, startRipple, rows }) => {
      let v = start;
      const stages = rows.map((r) => ({
        targetVoltage: (v *= r.frac),
        current: r.current,
        capacitance: r.capacitance,
      }));
      return { startVoltage: start, series, startRipple, stages };
    }),
  'choke-input': fc.record({
    windingVoltage: range(100, 600),
    rectifier,
    diodeDrop: range(0.6, 1.1),
    valveDrop: range(5, 60),
    windingResistance: range(0, 200),
    chokeInductance: range(1, 30),
    chokeResistance: range(10, 300),
    loadCurrent: range(0.01, 0.3),
    mainsFrequency: fc.constantFrom(50, 60),
    filterCapacitance: range(4.7e-6, 470e-6),
  }),
  'mains-conversion': fc.record({
    fromVoltage: fc.constantFrom(100, 117, 120, 220, 230, 240),
    fromFrequency: fc.constantFrom(50, 60),
    toVoltage: range(100, 250),
    toFrequency: fc.constantFrom(50, 60),
    connections: fc.array(fc.record({ volts: range(100, 250) }), { minLength: 1, maxLength: 4 }),
    fuseRating: range(0.1, 3),
    series: fc.constantFrom('iec', 'north-american'),
    secondaryVoltage: range(5, 600),
  }),
  'switch-on-surge': fc.record({
    windingVoltage: range(50, 600),
    mainsVoltage: range(100, 250),
    rectifier,
    diodeDrop: range(0.6, 1.1),
    valveDrop: range(5, 60),
    secondaryResistance: range(1, 300),
    primaryResistance: range(1, 60),
    reservoir: range(4.7e-6, 1e-3),
    fuseI2t: range(0.1, 100),
    diodeSurge: range(10, 200),
    mainsFrequency: fc.constantFrom(50, 60),
  }),
  'transformer-loading': fc.record({
    mainsVoltage: range(100, 250),
    primaryResistance: range(0.5, 50),
    efficiency: range(70, 95),
    ratedVA: range(10, 500),
    windings: fc.array(
      fc.record({
        volts: range(5, 500),
        amps: range(0, 3),
        ratedAmps: range(0.05, 5),
        resistance: range(0.01, 200),
      }),
      { minLength: 1, maxLength: 4 },
    ),
  }),
  'rectifier-substitution': fc.record({
    windingVoltage: range(50, 600),
    circuit: fc.constantFrom('centre-tap', 'bridge'),
    from: fc.constantFrom('valve', 'silicon'),
    to: fc.constantFrom('valve', 'silicon'),
    fromValveDrop: range(5, 80),
    toValveDrop: range(5, 80),
    diodeDrop: range(0.6, 1.1),
    loadCurrent: range(0.01, 0.4),
    nodes: fc.array(fc.record({ volts: range(50, 600) }), { maxLength: 4 }),
    highMains: range(0, 15),
    diodePiv: range(100, 2000),
  }),
  'part-ratings': fc.record({
    windingVoltage: range(100, 500),
    highMains: range(0, 15),
    unloadedRise: range(0, 15),
    rectifier,
    diodeDrop: range(0.6, 1.1),
    valveDrop: range(5, 40),
    sourceResistance: range(5, 300),
    mainsFrequency: fc.constantFrom(50, 60),
    loadCurrent: range(0, 0.3),
    reservoir: range(10e-6, 1e-3),
    capacitors: fc.array(fc.record({ rating: range(100, 800) }), { maxLength: 4 }),
    resistors: fc.array(
      fc.record({ resistance: range(10, 1e5), current: range(0, 0.1), powerRating: range(0.25, 20) }),
      { maxLength: 4 },
    ),
  }),
  bleeder: fc.record({
    capacitance: range(1e-6, 1e-3),
    chargedVoltage: range(10, 800),
    bleederResistance: range(1e3, 1e6),
    threshold: fc.constantFrom(50, 60),
    targetTime: range(1, 60),
  }),
  'heater-budget': fc.record({
    windingVoltage: fc.constantFrom(6.3, 12.6, 120, 230),
    windingCurrent: range(1, 10),
    arrangement: fc.constantFrom('parallel', 'series'),
    heaters: fc.array(
      fc.record({
        volts: fc.constantFrom(6.3, 12.6, 35, 50),
        amps: range(0.15, 2),
        count: fc.integer({ min: 1, max: 6 }),
      }),
      { minLength: 1, maxLength: 5 },
    ),
  }),
  'reading-tolerance': fc
    .record({
      unit: fc.constantFrom('V', 'A'),
      expected: range(0.1, 1000),
      negative: fc.boolean(),
      // An absolute tolerance below the smallest expected value: a wider one reaching past zero is refused by design.
      tolerance: fc.constantFrom(
        '±5 %',
        '±10 %',
        '+10 % / -5 %',
        { kind: 'percent', percent: 2 },
        { kind: 'absolute', amount: 0.05 },
      ),
      off: range(0.8, 1.2),
    })
    .map(({ unit, expected, negative, tolerance, off }) => {
      const e = negative ? -expected : expected;
      return { unit, expected: e, tolerance, measured: e * off };
    }),
};

describe('properties: outputs are finite or a named error, and most realistic inputs evaluate', () => {
  it('has an arbitrary for every kind in the registry', () => {
    expect(Object.keys(arbitraries).sort()).toEqual(
      listReckoners()
        .map((d) => d.kind)
        .sort(),
    );
  });

  it.each(listReckoners().map((d) => d.kind))('%s', (kind) => {
    let ok = 0;
    let total = 0;
    fc.assert(
      fc.property(arbitraries[kind]!, (input) => {
        total++;
        if (expectFiniteOrNamedError(kind, input)) ok++;
      }),
      { numRuns: kind === 'loaded-bplus' ? 120 : 300 },
    );
    expect(ok / total, `${kind}: ${ok} of ${total} evaluated`).toBeGreaterThanOrEqual(MIN_OK);
  });

  it('wide and extreme inputs still give finite outputs or named errors', () => {
    const wide: [string, fc.Arbitrary<Record<string, unknown>>][] = [
      [
        'loaded-bplus',
        fc.record({
          windingVoltage: range(5, 1000),
          sourceResistance: range(0.1, 2000),
          reservoir: range(1e-6, 4.7e-3),
          mainsFrequency: fc.constantFrom(50, 60),
          loadCurrent: range(0, 0.5),
          rectifier,
          diodeDrop: range(0, 1.2),
          valveDrop: range(0, 30),
        }),
      ],
      [
        'peak-no-load',
        fc.record({
          windingVoltage: range(0.1, 3000),
          mainsNominal: range(50, 300),
          mainsActual: range(50, 300),
          rectifier,
          valveDrop: range(0, 200),
        }),
      ],
      [
        'bleeder',
        fc.record({
          capacitance: range(1e-9, 1),
          chargedVoltage: range(0.1, 5000),
          bleederResistance: range(1, 1e9),
          threshold: range(1, 1000),
        }),
      ],
      [
        'reading-tolerance',
        fc.record({
          expected: range(-1e4, 1e4),
          tolerance: fc.record({ kind: fc.constant('percent'), percent: range(0, 100) }),
          measured: range(-1e4, 1e4),
        }),
      ],
    ];
    for (const [kind, arb] of wide) {
      fc.assert(
        fc.property(arb, (input) => void expectFiniteOrNamedError(kind, input)),
        { numRuns: kind === 'loaded-bplus' ? 100 : 200 },
      );
    }
  });
});

const loadedArb = arbitraries['loaded-bplus']! as fc.Arbitrary<
  { loadCurrent: number; reservoir: number } & Record<string, unknown>
>;

function bplus(inp: Record<string, unknown>) {
  const r = runReckoner('loaded-bplus', inp);
  return r.ok ? r.outputs : null;
}

describe('physical monotonicity', () => {
  it('more load current never raises loaded B+ [derived: more charge leaves the reservoir each half-cycle; docs/references.md §3]', () => {
    fc.assert(
      fc.property(loadedArb, fc.double({ min: 0, max: 0.5, noNaN: true }), (inp, other) => {
        const [lo, hi] = [Math.min(inp.loadCurrent, other), Math.max(inp.loadCurrent, other)];
        const a = bplus({ ...inp, loadCurrent: lo });
        const b = bplus({ ...inp, loadCurrent: hi });
        fc.pre(a !== null && b !== null);
        expect(b!.averageDc!.value as number).toBeLessThanOrEqual(
          (a!.averageDc!.value as number) * (1 + 1e-9),
        );
      }),
      { numRuns: 120 },
    );
  });

  it('more reservoir capacitance never raises ripple [derived: ΔV ≤ I/(2fC); docs/references.md §3]', () => {
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

  it('a larger bleeder never discharges faster [derived: t = RC ln(V₀/V_t); docs/references.md §5]', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1e-9, max: 1, noNaN: true }),
        range(0.1, 5000),
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
