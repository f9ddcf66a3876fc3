import { describe, expect, it } from 'vitest';
import { E12, E24, E48, E6, E96, floorESeries, nearestESeries } from '../../../shared/standards/eSeries';
import { IEC_60127_RATED_CURRENTS, nextFuseRating } from '../../../shared/standards/fuses';

describe('IEC 60063 E-series', () => {
  it('E6, E12, E24 hold the published tables [std: IEC 60063]', () => {
    expect(E6).toEqual([1.0, 1.5, 2.2, 3.3, 4.7, 6.8]);
    expect(E12).toEqual([1.0, 1.2, 1.5, 1.8, 2.2, 2.7, 3.3, 3.9, 4.7, 5.6, 6.8, 8.2]);
    expect(E24).toHaveLength(24);
    expect(E24.slice(10, 16)).toEqual([2.7, 3.0, 3.3, 3.6, 3.9, 4.3]);
  });

  it('E24 differs from the rounded formula at exactly the eight listed values [std: IEC 60063]', () => {
    const formula = Array.from({ length: 24 }, (_, i) => Math.round(10 ** (i / 24) * 10) / 10);
    const differing = E24.filter((v, i) => v !== formula[i]);
    expect(differing).toEqual([2.7, 3.0, 3.3, 3.6, 3.9, 4.3, 4.7, 8.2]);
  });

  it('E96 follows round(10^(i/96), 2) and E48 is every second value [derived]', () => {
    expect(E96).toHaveLength(96);
    expect(E48).toHaveLength(48);
    // Spot values recalled from printed tables [from memory]
    expect(E96).toContain(1.02);
    expect(E96).toContain(4.99);
    expect(E96).toContain(9.76);
    expect(E48[1]).toBe(E96[2]);
    // Every E6 value is in E12 and every E12 value is in E24 [std: IEC 60063 nesting]
    for (const v of E6) expect(E12).toContain(v);
    for (const v of E12) expect(E24).toContain(v);
  });

  it('nearest value on a log scale, across decades [derived]', () => {
    expect(nearestESeries(2500, 'E12')).toBe(2700); // docs/references.md §4: 2.5 kΩ → E12 2.7 kΩ
    expect(nearestESeries(2500, 'E24')).toBe(2400);
    expect(nearestESeries(9.9, 'E12')).toBe(10);
    expect(nearestESeries(0.0475, 'E12')).toBe(0.047);
    expect(floorESeries(24815, 'E12')).toBe(22000);
    expect(floorESeries(22000, 'E12')).toBe(22000);
  });
});

describe('IEC 60127-2 rated currents', () => {
  it('follow the R10 preferred numbers (ISO 3) [std: IEC 60127-2; derived from R10]', () => {
    // Each rating is a rounded R10 number 10^(i/10) (ISO 3 rounds 3.16 to 3.15, or 3.2 in 32 mA),
    // so every value lies within 1.5 % of some 10^(i/10), and consecutive values are one step apart.
    const steps = IEC_60127_RATED_CURRENTS.map((v) => Math.log10(v) * 10);
    for (const [i, st] of steps.entries()) {
      expect(Math.abs(st - Math.round(st)), `${IEC_60127_RATED_CURRENTS[i]} near an R10 number`).toBeLessThan(
        0.065,
      );
      if (i > 0) expect(Math.round(st) - Math.round(steps[i - 1]!)).toBe(1);
    }
    expect(IEC_60127_RATED_CURRENTS).toContain(0.315);
    expect(IEC_60127_RATED_CURRENTS).toContain(0.63);
  });

  it('picks the next rating at or above [std: IEC 60127-2]', () => {
    expect(nextFuseRating(0.5284)).toBe(0.63);
    expect(nextFuseRating(0.63)).toBe(0.63);
    expect(nextFuseRating(0.2757 * 1.25)).toBe(0.4);
    expect(nextFuseRating(11)).toBeNull();
    expect(nextFuseRating(0.6, 'north-american')).toBe(0.75);
  });
});
