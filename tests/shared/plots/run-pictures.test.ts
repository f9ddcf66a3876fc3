import { describe, expect, it } from 'vitest';
import { runPictures } from '../../../shared/plots/run-pictures';
import { lerp } from './reckoner-plot-helpers';
import { snapshotAt } from './run-snapshot';

describe('the run sheet’s reckoner pictures', () => {
  it('draws the ladder and the discharge (not every picture), named with the run’s mains', () => {
    const models = runPictures(snapshotAt(207), 207);
    expect(models.map((m) => m.plot)).toEqual(['ladder', 'discharge']);
    for (const m of models) expect(m.title).toMatch(/\(at 207 V mains\)$/);
  });

  it('works the staircase at the run’s measured mains: the start node is √2 × 300 V × 207/230 less two diodes [docs/references.md §2]', () => {
    const [ladder] = runPictures(snapshotAt(207), 207);
    const start = ladder!.marks.find((m) => m.key === 'start')!;
    const expected = Math.SQRT2 * 300 * (207 / 230) - 1.8;
    const y = (v: number) =>
      lerp(v, ladder!.y.scale.domain() as [number, number], ladder!.y.scale.range() as [number, number]);
    expect(start.y).toBeCloseTo(y(expected), 3);
    const [nominal] = runPictures(snapshotAt(230), 230);
    expect(nominal!.marks.find((m) => m.key === 'start')!.y).not.toBeCloseTo(start.y, 0);
  });
});
