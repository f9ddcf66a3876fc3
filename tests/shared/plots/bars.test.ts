import { describe, expect, it } from 'vitest';
import { BAR_FRAME } from '../../../shared/plots/bars';
import { plotFor } from '../../../shared/plots/reckoner-plots';
import { evaluatedBlock, expectRoundTicks, lerp, markup } from './reckoner-plot-helpers';

// Parallel heaters: 2 × 0.76 A + 3 × 0.3 A + 0.15 A = 2.57 A from a 3 A winding (85.7 %), warning above 90 %.
const heaters = plotFor(
  evaluatedBlock('heater-budget', 'heaters', {
    windingVoltage: '6.3 V',
    windingCurrent: '3 A',
    arrangement: 'parallel',
    heaters: [
      { label: 'Output pentode', volts: '6.3 V', amps: '0.76 A', count: 2 },
      { label: 'Double triode', volts: '6.3 V', amps: '0.3 A', count: 3 },
      { label: 'Pilot lamp', volts: '6.3 V', amps: '0.15 A', count: 1 },
    ],
    nearLimit: '90 %',
  }),
)!;
// Two windings: HT 300 V × 0.2 A = 60 VA of 300 V × 0.15 A = 45 VA rated (over); heaters 6.3 V × 2.5 A = 15.75 VA.
const transformer = plotFor(
  evaluatedBlock('transformer-loading', 'tx', {
    mainsVoltage: '230 V',
    efficiency: '90 %',
    ratedVA: '100 VA',
    windings: [
      { label: 'HT', volts: '300 V', amps: '0.2 A', ratedAmps: '0.15 A' },
      { label: 'Heaters', volts: '6.3 V', amps: '2.5 A' },
    ],
  }),
)!;
const dom = (m: typeof heaters) => m.x.scale.domain() as [number, number];
const rng = (m: typeof heaters) => m.x.scale.range() as [number, number];
const px = (m: typeof heaters, v: number) => lerp(v, dom(m), rng(m));

describe('heater current bars', () => {
  it('draws a bar per valve line and one for all of them, each from zero to its current', () => {
    expect(heaters.bars!.map((b) => b.key)).toEqual(['heater1', 'heater2', 'heater3', 'total']);
    [1.52, 0.9, 0.15, 2.57].forEach((amps, i) => {
      const bar = heaters.bars![i]!;
      expect(bar.x0).toBeCloseTo(px(heaters, 0), 6);
      expect(bar.x1).toBeCloseTo(px(heaters, amps), 6);
    });
    expect(heaters.y.ticks.map(heaters.y.format)).toEqual([
      'Output pentode × 2',
      'Double triode × 3',
      'Pilot lamp',
      'All heaters',
    ]);
  });

  it('holds the total against the winding rating, with the last 10 % shaded', () => {
    const rating = heaters.lines.find((l) => l.key === 'total-rating')!;
    expect(rating.points[0]![0]).toBeCloseTo(px(heaters, 3), 6);
    expect(rating.style).toBe('dashed');
    expect(heaters.marks.map((m) => m.shape)).toEqual(['diamond']);
    const [band] = heaters.bands;
    expect(band!.x0).toBeCloseTo(px(heaters, 2.7), 6);
    expect(band!.x1).toBeCloseTo(px(heaters, 3), 6);
    expect(heaters.description).toMatch(/within its rating/);
    expect(heaters.x.label).toBe('Heater current (A rms)');
  });

  it('has round current ticks from zero past the rating, and one row height per bar', () => {
    expect(expectRoundTicks(heaters.x.ticks)).toEqual([]);
    expect(dom(heaters)[0]).toBe(0);
    expect(dom(heaters)[1]).toBeGreaterThanOrEqual(3);
    expect(heaters.height).toBe(BAR_FRAME.top + 4 * BAR_FRAME.rowHeight + BAR_FRAME.bottom);
    expect(markup(heaters).match(/data-bar=/g)).toHaveLength(4);
  });
});

describe('transformer VA bars', () => {
  it('draws each winding’s V × I and the total, each against its rating in VA', () => {
    const bar = (k: string) => transformer.bars!.find((b) => b.key === k)!;
    expect(bar('winding1').x1).toBeCloseTo(px(transformer, 60), 6);
    expect(bar('winding2').x1).toBeCloseTo(px(transformer, 15.75), 6);
    expect(bar('total').x1).toBeCloseTo(px(transformer, 75.75), 6);
    const rating = (k: string) => transformer.marks.find((m) => m.key === `${k}-rating`)?.x;
    expect(rating('winding1')).toBeCloseTo(px(transformer, 45), 6);
    expect(rating('winding2')).toBeUndefined();
    expect(rating('total')).toBeCloseTo(px(transformer, 100), 6);
    expect(transformer.description).toMatch(/Over its rating: HT\./);
    expect(expectRoundTicks(transformer.x.ticks)).toEqual([]);
    expect(transformer.x.label).toBe('Load (VA)');
  });
});
