import { scaleLinear } from '@visx/scale';
import type { ReadingsPlot } from '../runs/readings-plot';
import type { MarkerKind } from './parts';

/** Where each part of the readings-against-bands plot goes, in the SVG's own units (1 unit = 1 px = 1 pt in the PDF). */
export const DEVIATION_FRAME = { width: 680, labelWidth: 210, right: 24, top: 34, rowHeight: 26, bottom: 52 };
/** About this many round ticks (d3's 1-2-5 steps, docs/references.md §11). */
export const DEVIATION_TICKS = 6;
/** A point further out than this many widths of the widest band is drawn at the axis's edge, so one wild reading does not squash every band. */
export const CLIP_BANDS = 4;

export interface DeviationRow {
  stepId: string;
  label: string;
  y: number;
  band: { x0: number; x1: number };
  point: { x: number; kind: MarkerKind };
  /** Beyond the axis: which edge the point is held at. */
  clipped: 'low' | 'high' | null;
  /** The full figures, for the point's tooltip. */
  title: string;
}

const shorten = (s: string, n: number) => (s.length > n ? `${s.slice(0, n - 1)}…` : s);

export function deviationLayout(plot: ReadingsPlot) {
  const f = DEVIATION_FRAME;
  const rows = plot.readings;
  const widest = Math.max(1, ...rows.flatMap((r) => [Math.abs(r.low), Math.abs(r.high)]));
  const limit = CLIP_BANDS * widest;
  const held = (d: number) => Math.max(-limit, Math.min(limit, d));
  const values = [0, ...rows.flatMap((r) => [r.low, r.high, held(r.deviation)])];
  const x = scaleLinear<number>({
    domain: [Math.min(...values), Math.max(...values)],
    range: [f.labelWidth + 10, f.width - f.right],
    nice: DEVIATION_TICKS,
  });
  const [lo, hi] = x.domain() as [number, number];
  const plotHeight = rows.length * f.rowHeight;
  return {
    width: f.width,
    height: f.top + plotHeight + f.bottom,
    x,
    ticks: x.ticks(DEVIATION_TICKS),
    plotTop: f.top,
    plotBottom: f.top + plotHeight,
    rows: rows.map((r, i): DeviationRow => {
      const clipped = r.deviation < lo ? 'low' : r.deviation > hi ? 'high' : null;
      return {
        stepId: r.stepId,
        label: shorten(`${r.position}. ${r.label}`, 30),
        y: f.top + i * f.rowHeight + f.rowHeight / 2,
        band: { x0: x(r.low), x1: x(r.high) },
        point: {
          x: x(clipped === 'low' ? lo : clipped === 'high' ? hi : r.deviation),
          kind: r.out ? 'out' : 'within',
        },
        clipped,
        title: `${r.position}. ${r.label}: ${r.text.deviation} (band ${r.text.band}), ${r.text.mark}`,
      };
    }),
  };
}
