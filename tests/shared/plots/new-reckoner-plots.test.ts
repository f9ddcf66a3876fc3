import { describe, expect, it } from 'vitest';
import { plotFor } from '../../../shared/plots/reckoner-plots';
import { evaluatedBlock, expectRoundTicks, lerp, markup } from './reckoner-plot-helpers';

type Model = NonNullable<ReturnType<typeof plotFor>>;
const dom = (a: Model['x']) => a.scale.domain() as [number, number];
const rng = (a: Model['x']) => a.scale.range() as [number, number];
const at = (m: Model) => ({
  px: (v: number) => lerp(v, dom(m.x), rng(m.x)),
  py: (v: number) => lerp(v, dom(m.y), rng(m.y)),
});

describe('choke-input: output against load current', () => {
  // 350 V bridge winding, 0.9 V diodes (1.8 V), 100 Ω choke, 10 H, 150 mA, 50 Hz.
  // By hand: average 2√2/π × 350 = 315.12 V; at 150 mA 315.12 − 1.8 − 15 = 298.32 V;
  // critical current 298.32 ÷ (3 × 2π × 50 × 10) = 31.65 mA; no-load 494.97 − 1.8 = 493.17 V (docs/references.md §3).
  const block = evaluatedBlock('choke-input', 'choke', {
    windingVoltage: '350 V',
    rectifier: 'silicon-bridge',
    diodeDrop: '0.9 V',
    chokeInductance: '10 H',
    chokeResistance: '100 Ω',
    loadCurrent: '150 mA',
    lightestLoad: '20 mA',
  });
  const model = plotFor(block)!;
  const { px, py } = at(model);
  const dc = ((2 * Math.SQRT2) / Math.PI) * 350 - 1.8 - 15;
  const critical = dc / (3 * 2 * Math.PI * 50 * 10);

  it('marks the load, the knee at the critical current and the no-load peak at their values', () => {
    const load = model.marks.find((m) => m.key === 'load')!;
    expect(load.x).toBeCloseTo(px(150), 6);
    expect(load.y).toBeCloseTo(py(dc), 3);
    const knee = model.marks.find((m) => m.key === 'knee')!;
    expect(knee.shape).toBe('triangle');
    expect(knee.x).toBeCloseTo(px(critical * 1000), 3);
    expect(knee.y).toBeCloseTo(py(dc + (0.15 - critical) * 100), 3);
    const rise = model.lines.find((l) => l.key === 'rise')!;
    expect(rise.points[0]![1]).toBeCloseTo(py(Math.SQRT2 * 350 - 1.8), 3);
    // The loads below the critical current are shaded, and the lightest load falls in them.
    expect(model.bands[0]!.x1).toBeCloseTo(px(critical * 1000), 3);
    expect(model.description).toMatch(/lightest load, 20 mA, is below it/);
  });

  it('has round ticks and units on both axes, and a table', () => {
    expect(expectRoundTicks(model.x.ticks)).toEqual([]);
    expect(expectRoundTicks(model.y.ticks)).toEqual([]);
    expect(model.x.label).toBe('Load current (mA DC)');
    expect(model.y.label).toBe('Output voltage (V DC)');
    expect(model.table.rows.map((r) => r.key)).toEqual(['no-load', 'knee', 'load', 'lightest']);
    expect(markup(model)).toContain('Load current (mA DC)');
  });
});

describe('rectifier substitution: B+ before and after', () => {
  // A 5Y3-style valve dropping 50 V swapped for a silicon bridge (2 × 1 V): every node rises 48 V.
  const block = evaluatedBlock('rectifier-substitution', 'swap', {
    windingVoltage: '350 V',
    circuit: 'bridge',
    from: 'valve',
    to: 'silicon',
    fromValveDrop: '50 V',
    diodeDrop: '1 V',
    loadCurrent: '120 mA',
    nodes: [
      { label: 'Reservoir', volts: '380 V' },
      { label: 'Screens', volts: '340 V' },
      { label: 'Preamp', volts: '260 V' },
    ],
  });
  const model = plotFor(block)!;
  const { py } = at(model);

  it('draws the fitted and the new staircase 48 V apart at every node, and the no-load peak at high mains', () => {
    const before = model.lines.find((l) => l.key === 'before')!.points;
    const after = model.lines.find((l) => l.key === 'after')!.points;
    [380, 340, 260].forEach((volts, i) => {
      expect(before[2 * i]![1]).toBeCloseTo(py(volts), 3);
      expect(after[2 * i]![1]).toBeCloseTo(py(volts + 48), 3);
    });
    // √2 × 350 × 1.1 − 2 = 542.5 V.
    expect(model.lines.find((l) => l.key === 'peak')!.points[0]![1]).toBeCloseTo(py(Math.SQRT2 * 385 - 2), 3);
    expect(new Set(model.marks.map((m) => m.shape))).toEqual(new Set(['square', 'circle']));
    expect(expectRoundTicks(model.y.ticks)).toEqual([]);
    expect(model.y.label).toBe('Node voltage (V DC)');
    expect(model.table.rows[1]!.cells).toEqual(['Screens', '340 V', '388 V', '48 V']);
  });

  it('draws nothing without nodes', () => {
    const bare = evaluatedBlock('rectifier-substitution', 'swap', {
      windingVoltage: '350 V',
      fromValveDrop: '50 V',
      loadCurrent: '120 mA',
    });
    expect(plotFor(bare)).toBeNull();
  });
});

describe('part ratings: stress against rating', () => {
  // 300 V winding, +10 % mains and +10 % unloaded rise: no-load peak √2 × 300 × 1.21 − 2 = 511.4 V.
  const block = evaluatedBlock('part-ratings', 'parts', {
    windingVoltage: '300 V',
    rectifier: 'silicon-bridge',
    diodeDrop: '1 V',
    sourceResistance: '60 Ω',
    loadCurrent: '150 mA',
    reservoir: '100 µF',
    capacitors: [
      { label: 'Reservoir', rating: '450 V' },
      { label: 'Second', rating: '630 V' },
    ],
    resistors: [{ label: 'R1', resistance: '1k', current: '50 mA', powerRating: '5 W' }],
    resistorDerating: '50 %',
    diodePiv: '1000 V',
  });
  const model = plotFor(block)!;
  const { px } = at(model);
  const peak = Math.SQRT2 * 300 * 1.21 - 2;

  it('puts each part’s stress as a share of its rating, the rating at 100 % and the derating shaded', () => {
    expect(model.bars!.map((b) => b.key)).toEqual(['capacitor1', 'capacitor2', 'resistor1', 'piv']);
    expect(model.bars![0]!.x1).toBeCloseTo(px((100 * peak) / 450), 3);
    expect(model.bars![1]!.x1).toBeCloseTo(px((100 * peak) / 630), 3);
    // 50 mA² × 1 kΩ = 2.5 W of 5 W.
    expect(model.bars![2]!.x1).toBeCloseTo(px(50), 3);
    // Bridge PIV √2 × 300 × 1.21 = 513.4 V of 1000 V.
    expect(model.bars![3]!.x1).toBeCloseTo(px(100 * Math.SQRT2 * 0.3 * 1.21), 3);
    for (const line of model.lines) expect(line.points[0]![0]).toBeCloseTo(px(100), 6);
    expect(model.bands).toHaveLength(1);
    expect(model.bands[0]!.x0).toBeCloseTo(px(50), 6);
    expect(model.description).toMatch(/Over its rating: Reservoir\./);
  });

  it('has round ticks, the unit in its axis title, and the figures in their own units in the table', () => {
    expect(expectRoundTicks(model.x.ticks)).toEqual([]);
    expect(model.x.label).toBe('Stress at high mains (% of the rating)');
    expect(model.table.rows[2]!.cells).toEqual(['R1: power', '2.5 W', '5 W', '50 %']);
    expect(markup(model)).toContain('data-bar');
  });
});
