import { createElement } from 'react';
import { renderToStaticMarkup } from 'react-dom/server';
import { describe, expect, it } from 'vitest';
import { axisUnit, TREND_FRAME, trendPlot } from '../../../shared/plots/trend';
import { TrendPlotSvg } from '../../../shared/plots/trend-plot';
import type { TrendPoint } from '../../../shared/schemas/units';

/** A visit: B+ expected 350 V at 230 V mains, scaled with the visit's mains (a rectified supply follows it), ±5 %. */
function visit(i: number, mains: number, measured: number): TrendPoint {
  const expected = (350 * mains) / 230;
  const [low, high] = [expected * 0.95, expected * 1.05];
  return {
    runId: `run-${i}`,
    at: `2026-0${i + 1}-10T09:00:00.000Z`,
    revisionNumber: 2,
    measured,
    expected,
    low,
    high,
    within: measured >= low && measured <= high,
    mainsVoltage: mains,
  };
}
const points = [visit(0, 230, 352), visit(1, 241, 366), visit(2, 226, 318)];
const reading = { id: 'bplus', label: 'B+', unit: 'V', measure: 'dc' as const };
const model = trendPlot({ readings: [], reading, points });

const isNiceStep = (step: number) => {
  const decade = 10 ** Math.floor(Math.log10(step));
  return [1, 2, 5, 10].some((m) => Math.abs(step / decade - m) < 1e-9);
};

describe('the unit trend plot', () => {
  it('names the value axis with the reading and its unit and measure', () => {
    expect(model.yLabel).toBe('B+ (V DC)');
    expect(axisUnit('A', 'rms')).toBe('A rms');
    expect(axisUnit('Ω', null)).toBe('Ω');
  });

  it('has round value ticks covering every measured value and band edge (Heckbert, docs/references.md §11)', () => {
    const [d0, d1] = model.y.domain() as [number, number];
    expect(model.ticks[0]).toBe(d0);
    expect(model.ticks.at(-1)).toBe(d1);
    const step = model.ticks[1]! - model.ticks[0]!;
    expect(isNiceStep(step), `step ${step}`).toBe(true);
    for (const t of model.ticks) expect(Math.abs(t / step - Math.round(t / step))).toBeLessThan(1e-9);
    for (const p of points) {
      expect(d0).toBeLessThanOrEqual(Math.min(p.measured, p.low!));
      expect(d1).toBeGreaterThanOrEqual(Math.max(p.measured, p.high!));
    }
  });

  it('puts each visit’s band edges at the right height, by linear interpolation of the value axis', () => {
    const [d0, d1] = model.y.domain() as [number, number];
    const [bottom, top] = [TREND_FRAME.height - TREND_FRAME.bottom, TREND_FRAME.top];
    const py = (v: number) => bottom - ((v - d0) / (d1 - d0)) * (bottom - top);
    // The outline runs along the highs left to right, then back along the lows.
    const n = points.length;
    points.forEach((p, i) => {
      expect(model.band[i]![1]).toBeCloseTo(py(p.high!), 6);
      expect(model.band[2 * n - 1 - i]![1]).toBeCloseTo(py(p.low!), 6);
    });
  });

  it('flags the visit outside its band and draws it as a triangle', () => {
    // 318 V at 226 V mains: the band is 350 × 226 / 230 ± 5 % = 326.7 … 361.1 V.
    expect(318 < ((350 * 226) / 230) * 0.95).toBe(true);
    expect(model.points.map((p) => p.kind)).toEqual(['within', 'within', 'out']);
    expect(model.rows[2]!.mark).toBe('out of band');
    const svg = renderToStaticMarkup(createElement(TrendPlotSvg, { model, id: 't' }));
    expect(svg.match(/data-marker="out"/g)).toHaveLength(2); // the legend's and the visit's
    expect(svg).toMatch(/role="img"[^>]* aria-labelledby="t-title" aria-describedby="t-desc"/);
    expect(svg).toContain('<title id="t-title">B+ across visits</title>');
    expect(svg).toContain('B+ (V DC)');
    expect(model.description).toMatch(/3 visits, 2026-01-10 to 2026-03-10, in V DC.*1 out of band/);
  });

  it('shows a single visit’s band as a bar around it', () => {
    const one = trendPlot({ readings: [], reading, points: [points[0]!] });
    expect(one.band).toHaveLength(4);
    expect(one.band[0]![0]).toBeLessThan(one.points[0]!.x);
    expect(one.band[1]![0]).toBeGreaterThan(one.points[0]!.x);
  });
});
