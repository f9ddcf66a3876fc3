import fc from 'fast-check';
import { createElement } from 'react';
import { renderToStaticMarkup } from 'react-dom/server';
import { describe, expect, it } from 'vitest';
import { CLIP_BANDS, DEVIATION_FRAME, deviationLayout } from '../../../shared/plots/deviation-layout';
import { DeviationPlotSvg } from '../../../shared/plots/deviation-plot';
import { readingsPlot, type ReadingsPlot } from '../../../shared/runs/readings-plot';
import type { EntryView, RunStep } from '../../../shared/schemas/runs';

const tom = { id: 't', displayName: 'Tom Achterberg' };

/** A reading step with a ± band in percent, and its entry worked out here by plain arithmetic. */
function reading(id: string, position: number, expected: number, bandPct: number, value?: number) {
  const low = expected * (1 - bandPct / 100);
  const high = expected * (1 + bandPct / 100);
  const step: RunStep = {
    id,
    kind: 'reading',
    position,
    section: 'Power supply',
    text: `Reading ${id}`,
    reading: {
      testPoint: `TP ${id}`,
      meterRange: '1000 V DC',
      unit: 'V',
      toleranceText: `±${bandPct} %`,
      expectedSource: 'number',
      expected,
      low,
      high,
      bandText: `±${bandPct} %`,
    },
  };
  const entry: EntryView | undefined =
    value === undefined
      ? undefined
      : {
          stepId: id,
          kind: 'reading',
          raw: `${value} V`,
          measured: value,
          unit: 'V',
          expected,
          low,
          high,
          within: value >= low && value <= high,
          deviation: value - expected,
          deviationPercent: ((value - expected) / expected) * 100,
          done: false,
          note: '',
          version: 1,
          lastKey: 'k',
          enteredBy: tom,
          enteredAt: '2026-03-04T05:06:07.890Z',
          history: [],
        };
  return { step, entry };
}

function plotOf(rows: ReturnType<typeof reading>[]): ReadingsPlot {
  return readingsPlot(
    rows.map((r) => r.step),
    rows.flatMap((r) => (r.entry ? [r.entry] : [])),
  );
}

/** Heckbert's nice numbers (docs/references.md §11): the step is 1, 2 or 5 × 10ⁿ. */
function isNiceStep(step: number): boolean {
  const decade = 10 ** Math.floor(Math.log10(step));
  return [1, 2, 5, 10].some((m) => Math.abs(step / decade - m) < 1e-9);
}

describe('the readings-against-bands plot', () => {
  const b = reading('b', 1, 250, 5, 290); // +16 %: out of its ±5 % band
  const h = reading('h', 2, 6.3, 10, 6.4); // +1.59 %: in band
  const none = reading('n', 3, 350, 5); // not measured: not plotted
  const plot = plotOf([b, h, none]);

  it('places each measured reading as its deviation in percent, beside its own band in percent', () => {
    expect(plot.readings.map((r) => r.stepId)).toEqual(['b', 'h']);
    const [rb, rh] = plot.readings;
    // (290 − 250) / 250 × 100 = 16; band 237.5 … 262.5 V is −5 … +5 % of 250 V.
    expect(rb!.deviation).toBeCloseTo(16, 9);
    expect([rb!.low, rb!.high]).toEqual([-5, 5]);
    expect(rh!.deviation).toBeCloseTo(((6.4 - 6.3) / 6.3) * 100, 9);
    expect(plot.axisLabel).toBe('Deviation from expected (%)');
    expect(rb!.text).toEqual({ deviation: '+16 %', band: '-5 % … +5 %', mark: 'out of band' });
  });

  it('flags the out-of-band reading from its recorded check, and says so in the description', () => {
    // 290 V is above the 262.5 V top of its band; 6.4 V is inside 5.67 … 6.93 V.
    expect(plot.readings.map((r) => r.out)).toEqual([290 > 250 * 1.05, !(6.4 <= 6.3 * 1.1)]);
    const l = deviationLayout(plot);
    expect(l.rows.map((r) => r.point.kind)).toEqual(['out', 'within']);
    expect(plot.description).toMatch(/Out of band: 1\. Reading b \(\+16 %, band -5 % … \+5 %\)/);
  });

  it('has round ticks, and an axis that starts and ends on one (Heckbert, docs/references.md §11)', () => {
    const l = deviationLayout(plot);
    const [d0, d1] = l.x.domain() as [number, number];
    expect(l.ticks[0]).toBe(d0);
    expect(l.ticks.at(-1)).toBe(d1);
    const steps = l.ticks.slice(1).map((t, i) => t - l.ticks[i]!);
    for (const s of steps) expect(s).toBeCloseTo(steps[0]!, 9);
    expect(isNiceStep(steps[0]!), `step ${steps[0]}`).toBe(true);
    expect(l.ticks.length).toBeGreaterThanOrEqual(3);
  });

  it('maps each band’s edges to the pixels between which they lie, by linear interpolation', () => {
    const l = deviationLayout(plot);
    const [d0, d1] = l.x.domain() as [number, number];
    const [r0, r1] = [DEVIATION_FRAME.labelWidth + 10, DEVIATION_FRAME.width - DEVIATION_FRAME.right];
    const px = (v: number) => r0 + ((v - d0) / (d1 - d0)) * (r1 - r0);
    for (const [i, r] of plot.readings.entries()) {
      expect(l.rows[i]!.band.x0).toBeCloseTo(px(r.low), 6);
      expect(l.rows[i]!.band.x1).toBeCloseTo(px(r.high), 6);
      expect(l.rows[i]!.point.x).toBeCloseTo(px(r.deviation), 6);
      expect(l.rows[i]!.band.x0).toBeLessThan(l.rows[i]!.band.x1);
    }
    expect(l.x(0)).toBeCloseTo(px(0), 6);
  });

  it('any set of bands and readings: ticks stay round and every band and point inside the axis', () => {
    const row = fc.record({
      expected: fc.double({ min: 1, max: 1000, noNaN: true }),
      band: fc.integer({ min: 1, max: 30 }),
      factor: fc.double({ min: 0.2, max: 3, noNaN: true }),
    });
    fc.assert(
      fc.property(fc.array(row, { minLength: 1, maxLength: 8 }), (rows) => {
        const p = plotOf(
          rows.map((r, i) => reading(`r${i}`, i + 1, r.expected, r.band, r.expected * r.factor)),
        );
        const l = deviationLayout(p);
        const [r0, r1] = l.x.range() as [number, number];
        const step = l.ticks[1]! - l.ticks[0]!;
        expect(isNiceStep(step)).toBe(true);
        for (const r of l.rows) {
          expect(r.band.x0).toBeGreaterThanOrEqual(r0 - 1e-6);
          expect(r.band.x1).toBeLessThanOrEqual(r1 + 1e-6);
          expect(r.point.x).toBeGreaterThanOrEqual(r0 - 1e-6);
          expect(r.point.x).toBeLessThanOrEqual(r1 + 1e-6);
        }
      }),
      { numRuns: 200 },
    );
  });

  it('holds a wild reading at the axis edge with an arrow, so the bands keep their width', () => {
    const wild = plotOf([reading('w', 1, 250, 5, 500), reading('ok', 2, 250, 5, 251)]); // +100 %
    const l = deviationLayout(wild);
    const [, d1] = l.x.domain() as [number, number];
    expect(d1).toBeLessThan(100);
    expect(d1).toBeGreaterThanOrEqual(CLIP_BANDS * 5);
    expect(l.rows[0]!.clipped).toBe('high');
    expect(l.rows[0]!.point.x).toBeCloseTo(l.x.range()[1]!, 6);
    expect(renderToStaticMarkup(createElement(DeviationPlotSvg, { plot: wild, id: 'p' }))).toContain(
      'data-clipped="high"',
    );
  });

  it('draws out of band as a triangle and in band as a circle (not colour alone), with a name and description', () => {
    const svg = renderToStaticMarkup(createElement(DeviationPlotSvg, { plot, id: 'p1' }));
    expect(svg).toMatch(/^<svg[^>]* role="img"[^>]* aria-labelledby="p1-title" aria-describedby="p1-desc"/);
    expect(svg).toContain(`<title id="p1-title">Readings against their bands</title>`);
    expect(svg).toMatch(/<desc id="p1-desc">2 readings plotted/);
    const rowsOnly = svg.slice(svg.indexOf('data-plot-step')); // past the legend
    expect(rowsOnly).toMatch(/<polygon data-marker="out"/);
    expect(rowsOnly).toMatch(/<circle data-marker="within"/);
    expect(svg).toContain('Deviation from expected (%)');
    // Set by attributes only: svg-to-pdfkit ignores style sheets (visx's own class names are inert).
    expect(svg).not.toContain('style=');
    expect(svg.match(/class="[^"]*"/g)?.every((c) => /^class="visx-[\w -]+"$/.test(c))).toBe(true);
  });

  it('does not plot a reading whose expected value is zero, and says why', () => {
    const zero = reading('z', 1, 0, 5, 0.1);
    zero.step.reading = { ...zero.step.reading!, low: -0.5, high: 0.5 };
    zero.entry = { ...zero.entry!, low: -0.5, high: 0.5, within: true, deviationPercent: null };
    const p = plotOf([zero]);
    expect(p.readings).toEqual([]);
    expect(p.notPlotted).toEqual(['1. Reading z: the expected value is zero, so there is no percentage']);
  });
});
