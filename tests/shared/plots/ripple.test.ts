import { describe, expect, it } from 'vitest';
import { plotFor } from '../../../shared/plots/reckoner-plots';
import { RECKONER_FRAME } from '../../../shared/plots/reckoner-plot';
import { solveByRk4 } from '../reckoners/capacitor-input-rk4';
import { evaluatedBlock, expectRoundTicks, lerp, markup } from './reckoner-plot-helpers';

// Heavy ripple so the shape is plain: 250 V, 60 Ω, 47 µF, 50 Hz, 120 mA, silicon bridge (2 × 0.9 V).
const inputs = {
  windingVoltage: 250,
  sourceResistance: 60,
  reservoir: 47e-6,
  mainsFrequency: 50,
  loadCurrent: 0.12,
  rectifier: 'silicon-bridge',
};
const block = evaluatedBlock('loaded-bplus', 'bplus', inputs);
const model = plotFor(block)!;
const out = (k: string) => block.outputs[k]!.value as number;
const domain = (a: typeof model.x) => a.scale.domain() as [number, number];
const range = (a: typeof model.x) => a.scale.range() as [number, number];
/** The drawn waveform read back into ms and volts by plain interpolation. */
const wave = model.lines
  .find((l) => l.key === 'wave')!
  .points.map(([px, py]) => [
    lerp(px, range(model.x), domain(model.x)),
    lerp(py, range(model.y), domain(model.y)),
  ]);

describe('the reservoir ripple picture of a loaded-B+ block', () => {
  it('spans two ripple periods of 10 ms at 50 Hz, with ms and V in the axis titles', () => {
    expect(model.x.label).toMatch(/\(ms\)$/);
    expect(model.y.label).toMatch(/\(V DC\)$/);
    expect(wave[0]![0]).toBeCloseTo(0, 9);
    expect(wave.at(-1)![0]).toBeCloseTo(20, 9);
    expect(domain(model.x)[1]).toBeGreaterThanOrEqual(20);
  });

  it('has round ticks on both axes, covering the waveform', () => {
    expect(expectRoundTicks(model.x.ticks)).toEqual([]);
    expect(expectRoundTicks(model.y.ticks)).toEqual([]);
    expect(domain(model.y)[0]).toBeLessThanOrEqual(out('minimumDc'));
    expect(domain(model.y)[1]).toBeGreaterThanOrEqual(out('maximumDc'));
  });

  it('draws a waveform whose mean over a period is the block’s average DC, within 0.5 %', () => {
    const first = wave.filter(([t]) => t! <= 10 + 1e-9);
    let area = 0;
    for (let i = 1; i < first.length; i++)
      area += ((first[i]![1]! + first[i - 1]![1]!) / 2) * (first[i]![0]! - first[i - 1]![0]!);
    expect(Math.abs(area / 10 / out('averageDc') - 1)).toBeLessThan(0.005);
  });

  it('agrees with an independent RK4 integration of the circuit: trough and crest within 1 % (docs/references.md §3)', () => {
    const rk = solveByRk4({
      vPeak: 250 * Math.SQRT2,
      drop: 1.8,
      rs: 60,
      c: 47e-6,
      f: 50,
      load: { current: 0.12 },
    });
    const vs = wave.map(([, v]) => v!);
    expect(Math.abs(Math.min(...vs) / rk.minimum - 1)).toBeLessThan(0.01);
    expect(Math.abs(Math.max(...vs) / rk.maximum - 1)).toBeLessThan(0.01);
  });

  it('puts the average and the trough lines, and the trough marks, at their heights', () => {
    const py = (v: number) => lerp(v, domain(model.y), range(model.y));
    const line = (k: string) => model.lines.find((l) => l.key === k)!;
    expect(line('average').points[0]![1]).toBeCloseTo(py(out('averageDc')), 6);
    expect(line('average').style).toBe('dashed');
    expect(line('trough').points[0]![1]).toBeCloseTo(py(out('minimumDc')), 6);
    expect(model.marks).toHaveLength(2);
    for (const m of model.marks) {
      expect(m.shape).toBe('triangle');
      expect(m.y).toBeCloseTo(py(out('minimumDc')), 6);
    }
    expect(model.marks[1]!.x - model.marks[0]!.x).toBeCloseTo(
      lerp(10, domain(model.x), range(model.x)) - lerp(0, domain(model.x), range(model.x)),
      6,
    );
  });

  it('draws inside its frame with an accessible name, description and the figures as text', () => {
    for (const l of model.lines)
      for (const [x, y] of l.points) {
        expect(x).toBeGreaterThanOrEqual(RECKONER_FRAME.left - 1e-9);
        expect(y).toBeLessThanOrEqual(RECKONER_FRAME.height - RECKONER_FRAME.bottom + 1e-9);
      }
    const svg = markup(model);
    expect(svg).toContain('role="img"');
    expect(svg).toContain('<title id="p-title">bplus: reservoir voltage over two ripple periods</title>');
    expect(svg).toMatch(/<desc id="p-desc">[^<]*average [\d.]+ V/);
    expect(model.table.rows.map((r) => r.cells[0])).toContain('Trough');
  });

  it('draws nothing for a block that did not evaluate or a kind without a picture', () => {
    expect(plotFor(undefined)).toBeNull();
    expect(plotFor({ name: 'x', kind: 'loaded-bplus', ok: false, errors: [] })).toBeNull();
    expect(plotFor({ ...block, kind: 'reading-tolerance' })).toBeNull();
  });
});
