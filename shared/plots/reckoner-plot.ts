import { scaleLinear, scaleLog } from '@visx/scale';
import type { ResolvedReading } from '../document/evaluate';
import type { BlockResult } from '../reckoners';
import { formatNumber } from '../units/format';

/**
 * A reckoner's picture, laid out in the SVG's own units (1 unit = 1 px = 1 pt in a PDF): every mark
 * already at its pixel, so one SVG component draws every kind and tests can check the pixels.
 */
export const RECKONER_FRAME = { width: 680, height: 320, left: 78, right: 30, top: 44, bottom: 58 };
/** About this many round ticks per axis (d3's 1-2-5 steps, docs/references.md §11). */
export const RECKONER_TICKS = 6;

/** A block as the plots read it: the evaluated result with its validated input (snapshots since inputs were kept). */
export type PlotBlock = Extract<BlockResult, { ok: true }>;

/** Marks differ by shape, not colour alone (WCAG 2.1 SC 1.4.1, docs/references.md §11). */
export type MarkShape = 'circle' | 'triangle' | 'square' | 'diamond';
export type LineStyle = 'solid' | 'dashed' | 'dotted';
export type LegendSign =
  { line: LineStyle; strong?: boolean } | { shape: MarkShape } | { band: true } | { bar: true };

type Scale = ReturnType<typeof scaleLinear<number>> | ReturnType<typeof scaleLog<number>>;

export interface PlotAxis {
  scale: Scale;
  ticks: number[];
  format: (v: number) => string;
  /** The axis title, with its unit ("Reservoir voltage (V)"). */
  label: string;
}

export interface PlotModel {
  /** data-plot on the SVG: which picture this is. */
  plot: string;
  title: string;
  description: string;
  caption: string;
  width: number;
  height: number;
  x: PlotAxis;
  y: PlotAxis;
  /** Which ticks the dashed grid follows: the value axis is y (rows) unless the bars run along x (columns). */
  grid?: 'rows' | 'columns';
  /** Solid bars (a load), in pixels. */
  bars?: { key: string; x0: number; x1: number; y0: number; y1: number; title: string }[];
  /** Shaded rectangles (tolerance bands, margins), in pixels. */
  bands: { key: string; x0: number; x1: number; y0: number; y1: number; title: string }[];
  lines: { key: string; points: [number, number][]; style: LineStyle; strong?: boolean; title?: string }[];
  marks: { key: string; x: number; y: number; shape: MarkShape; title: string }[];
  /** Words beside a line or mark. */
  labels: { key: string; x: number; y: number; text: string; anchor: 'start' | 'middle' | 'end' }[];
  legend: { sign: LegendSign; text: string }[];
  table: { label: string; columns: string[]; rows: { key: string; cells: string[] }[] };
}

/** A value axis over the values given, made round (nice) so its ends are ticks. */
export function linearAxis(values: number[], range: [number, number], label: string): PlotAxis {
  let [lo, hi] = [Math.min(...values), Math.max(...values)];
  if (lo === hi) [lo, hi] = [lo - (Math.abs(lo) * 0.05 || 1), hi + (Math.abs(hi) * 0.05 || 1)];
  const scale = scaleLinear<number>({ domain: [lo, hi], range, nice: RECKONER_TICKS });
  const ticks = scale.ticks(RECKONER_TICKS);
  const fmt = scale.tickFormat(RECKONER_TICKS);
  return { scale, ticks, format: (v) => fmt(v), label };
}

/** A log axis over whole decades (values > 0), ticked at 1, 2 and 5 of each decade (all of them when few decades). */
export function logAxis(values: number[], range: [number, number], label: string): PlotAxis {
  // A value near a decade's foot would sit on the axis itself: the decade below is added.
  const lo = 10 ** Math.floor(Math.log10(0.8 * Math.min(...values)));
  const hi = 10 ** Math.ceil(Math.log10(Math.max(...values)));
  const scale = scaleLog<number>({ domain: [lo, hi === lo ? lo * 10 : hi], range });
  const ticks = scale.ticks().filter((t) => {
    const m = Math.round(t / 10 ** Math.floor(Math.log10(t) + 1e-9));
    return m === 1 || m === 2 || m === 5;
  });
  return { scale, ticks, format: (v) => formatNumber(v, 3), label };
}

export const FRAME_X: [number, number] = [RECKONER_FRAME.left, RECKONER_FRAME.width - RECKONER_FRAME.right];
export const FRAME_Y: [number, number] = [RECKONER_FRAME.height - RECKONER_FRAME.bottom, RECKONER_FRAME.top];

/** The readings whose expected value is this output ("block.output"): their bands belong on its picture. */
export const readingsOf = (source: string, readings: readonly ResolvedReading[]) =>
  readings.filter((r) => r.expectedSource === source && r.low !== null && r.high !== null);

/** A layout: the block's picture from its result and the readings that check it, or null. */
export type PlotLayout = (block: PlotBlock, readings: readonly ResolvedReading[]) => PlotModel | null;

/**
 * A block's picture by `layout`, or null: not evaluated, or a snapshot stored before blocks kept their
 * validated input. A layout that cannot draw these inputs gives null too.
 */
export function drawBlock(
  layout: PlotLayout,
  block: BlockResult | undefined,
  readings: readonly ResolvedReading[],
): PlotModel | null {
  if (!block?.ok || !block.input) return null;
  try {
    return layout(block, readings);
  } catch {
    // The block's own outputs stand; a picture that cannot be drawn is left out.
    return null;
  }
}
