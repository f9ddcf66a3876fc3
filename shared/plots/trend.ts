import { scaleLinear, scalePoint } from '@visx/scale';
import type { Measure } from '../reckoners/types';
import { MARK_WORDS } from '../runs/marks';
import type { TrendView } from '../schemas/units';
import { formatQuantity } from '../units/format';
import type { MarkerKind } from './parts';

/** The unit trend plot: one reading across visits, each against the band at that visit's mains. */
export const TREND_FRAME = { width: 680, height: 300, left: 76, right: 28, top: 34, bottom: 70 };
/** About this many round ticks on the value axis (d3's 1-2-5 steps, docs/references.md §11). */
export const TREND_TICKS = 5;
/** More visits than this and only every n-th is named under the axis (every visit is in the table). */
const NAMED_VISITS = 8;

const MEASURE_WORDS: Record<Measure, string> = {
  dc: 'DC',
  rms: 'rms',
  peak: 'peak',
  'peak-to-peak': 'peak-to-peak',
  scalar: '',
};

/** "V DC", "A rms", "Ω": the unit an axis title names. */
export function axisUnit(unit: string, measure: Measure | null | undefined): string {
  const m = measure ? MEASURE_WORDS[measure] : '';
  return [unit, m].filter(Boolean).join(' ');
}

const day = (iso: string) => iso.slice(0, 10);

export interface TrendRow {
  visit: string;
  revision: string;
  mains: string;
  measured: string;
  expected: string;
  band: string;
  mark: string;
}

export function trendPlot(view: TrendView & { reading: NonNullable<TrendView['reading']> }) {
  const { points, reading } = view;
  const f = TREND_FRAME;
  const unit = axisUnit(reading.unit, reading.measure);
  const q = (v: number | null) => (v === null ? '—' : formatQuantity(v, reading.unit, 4));
  const values = points.flatMap((p) => [p.measured, p.low, p.high, p.expected].filter((v) => v !== null));
  let [lo, hi] = [Math.min(...values), Math.max(...values)];
  if (lo === hi) [lo, hi] = [lo - (Math.abs(lo) * 0.05 || 1), hi + (Math.abs(hi) * 0.05 || 1)];
  const y = scaleLinear<number>({
    domain: [lo, hi],
    range: [f.height - f.bottom, f.top],
    nice: TREND_TICKS,
  });
  const x = scalePoint<number>({
    domain: points.map((_, i) => i),
    range: [f.left, f.width - f.right],
    padding: 0.5,
  });
  const step = Math.ceil(points.length / NAMED_VISITS);
  const at = points.map((p, i) => ({ ...p, x: x(i)! }));
  const banded = at.filter((p) => p.low !== null && p.high !== null);
  const out = points.filter((p) => p.within === false).length;
  const rows: TrendRow[] = points.map((p) => ({
    visit: day(p.at),
    revision: String(p.revisionNumber),
    mains: formatQuantity(p.mainsVoltage, 'V', 4),
    measured: q(p.measured),
    expected: q(p.expected),
    band: p.low === null || p.high === null ? '—' : `${q(p.low)} … ${q(p.high)}`,
    mark: MARK_WORDS[p.within === null ? 'none' : p.within ? 'within' : 'out'],
  }));
  return {
    title: `${reading.label} across visits`,
    description: points.length
      ? `${reading.label} measured on ${points.length} ${points.length === 1 ? 'visit' : 'visits'}, ` +
        `${day(points[0]!.at)} to ${day(points.at(-1)!.at)}, in ${unit}, each against the tolerance band ` +
        `at that visit's measured mains. ${out ? `${out} out of band.` : 'All within their bands.'}`
      : `${reading.label} has not been measured yet.`,
    yLabel: `${reading.label} (${unit})`,
    xLabel: 'Visit (run started, UTC) and measured mains',
    caption:
      'Shaded: the tolerance band at each visit’s measured mains. Dashed: the expected value. ' +
      'Joined points: the measured values.',
    width: f.width,
    height: f.height,
    x,
    y,
    ticks: y.ticks(TREND_TICKS),
    /** The band at each visit's mains as one outline (a single visit: a short bar). */
    band:
      banded.length > 1
        ? [...banded.map((p) => [p.x, y(p.high!)]), ...[...banded].reverse().map((p) => [p.x, y(p.low!)])]
        : (banded.map((p) => [
            [p.x - 10, y(p.high!)],
            [p.x + 10, y(p.high!)],
            [p.x + 10, y(p.low!)],
            [p.x - 10, y(p.low!)],
          ])[0] ?? []),
    expected: at.filter((p) => p.expected !== null).map((p) => [p.x, y(p.expected!)] as const),
    /** The visits named under the axis: the date, and the mains that set the band. */
    named: points.map((_, i) => i).filter((i) => i % step === 0),
    points: at.map((p, i) => ({
      runId: p.runId,
      x: p.x,
      y: y(p.measured),
      kind: (p.within === null ? 'none' : p.within ? 'within' : 'out') as MarkerKind,
      date: rows[i]!.visit,
      mains: `${rows[i]!.mains} mains`,
      title: `${rows[i]!.visit}: ${rows[i]!.measured} (band ${rows[i]!.band}), ${rows[i]!.mark}`,
    })),
    unit,
    rows,
  };
}
