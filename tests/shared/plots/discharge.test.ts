import { describe, expect, it } from 'vitest';
import { plotFor } from '../../../shared/plots/reckoner-plots';
import { evaluatedBlock, expectRoundTicks, lerp } from './reckoner-plot-helpers';

// 100 µF charged to 400 V through 220 kΩ: τ = 22 s.
const base = { capacitance: '100u', chargedVoltage: '400 V', bleederResistance: '220k', threshold: '60 V' };
const linear = plotFor(evaluatedBlock('bleeder', 'bleed', base))!;
const withMilestones = plotFor(
  evaluatedBlock('bleeder', 'bleed', {
    ...base,
    elapsed: '30 s',
    milestones: [{ label: 'probe on', volts: '10 V' }],
  }),
)!;
const dom = (a: typeof linear.x) => a.scale.domain() as [number, number];
const rng = (a: typeof linear.x) => a.scale.range() as [number, number];
/** Back from pixels to seconds and volts, by plain interpolation (log10 on a log axis). */
const seconds = (m: typeof linear, px: number) => lerp(px, rng(m.x), dom(m.x));
const volts = (m: typeof linear, py: number, log: boolean) =>
  log ? 10 ** lerp(py, rng(m.y), dom(m.y).map(Math.log10) as [number, number]) : lerp(py, rng(m.y), dom(m.y));
/** The drawn curve's voltage at a time, by straight lines between its points. */
function curveAt(m: typeof linear, t: number, log: boolean) {
  const pts = m.lines
    .find((l) => l.key === 'curve')!
    .points.map(([x, y]) => [seconds(m, x), volts(m, y, log)]);
  const i = pts.findIndex(([s]) => s! >= t);
  const [[t0, v0], [t1, v1]] = [pts[i - 1]!, pts[i]!];
  return log ? v0! * (v1! / v0!) ** ((t - t0!) / (t1! - t0!)) : v0! + ((v1! - v0!) * (t - t0!)) / (t1! - t0!);
}

describe('the bleeder’s discharge curve', () => {
  it('falls to 1/e of the charged voltage after one time constant, R C = 22 s (the definition of τ)', () => {
    expect(linear.x.label).toBe('Time after switch-off (s)');
    expect(linear.y.label).toBe('Voltage left on the capacitor (V DC)');
    expect(curveAt(linear, 22, false) / (400 / Math.E)).toBeCloseTo(1, 2);
    const first = linear.lines.find((l) => l.key === 'curve')!.points[0]!;
    expect(volts(linear, first[1], false)).toBeCloseTo(400, 6);
  });

  it('puts the hazard threshold’s triangle on the curve where it crosses 60 V, with a dashed line at 60 V', () => {
    const mark = linear.marks.find((m) => m.key === 'hazard')!;
    expect(mark.shape).toBe('triangle');
    expect(volts(linear, mark.y, false)).toBeCloseTo(60, 6);
    expect(curveAt(linear, seconds(linear, mark.x), false) / 60).toBeCloseTo(1, 2);
    const line = linear.lines.find((l) => l.key === 'hazard')!;
    expect(line.style).toBe('dashed');
    expect(volts(linear, line.points[0]![1], false)).toBeCloseTo(60, 6);
  });

  it('has round ticks from 0 V and 0 s, reaching past the last threshold', () => {
    expect(expectRoundTicks(linear.x.ticks)).toEqual([]);
    expect(expectRoundTicks(linear.y.ticks)).toEqual([]);
    expect(dom(linear.y)[0]).toBe(0);
    expect(dom(linear.x)[0]).toBe(0);
    expect(seconds(linear, linear.marks[0]!.x)).toBeLessThan(dom(linear.x)[1]);
  });

  it('goes logarithmic when a threshold is far below the charged voltage, ticked at 1, 2 and 5 of each decade', () => {
    expect(withMilestones.y.label).toMatch(/log scale/);
    expect(dom(withMilestones.y)).toEqual([1, 1000]);
    for (const t of withMilestones.y.ticks)
      expect([1, 2, 5]).toContain(Math.round(t / 10 ** Math.floor(Math.log10(t))));
    const probe = withMilestones.marks.find((m) => m.key === 'milestone1')!;
    expect(probe.shape).toBe('square');
    expect(volts(withMilestones, probe.y, true)).toBeCloseTo(10, 6);
    expect(curveAt(withMilestones, seconds(withMilestones, probe.x), true) / 10).toBeCloseTo(1, 2);
    const asked = withMilestones.marks.find((m) => m.key === 'elapsed')!;
    expect(seconds(withMilestones, asked.x)).toBeCloseTo(30, 6);
    expect(volts(withMilestones, asked.y, true) / (400 * Math.exp(-30 / 22))).toBeCloseTo(1, 6);
  });

  it('draws nothing without a bleeder resistance (only the suggestion is computed)', () => {
    const { bleederResistance: _, ...rest } = base;
    expect(plotFor(evaluatedBlock('bleeder', 'bleed', rest))).toBeNull();
  });
});
