import { scaleLinear } from '@visx/scale';
import type { HeaterBudgetInput } from '../reckoners/heater-budget';
import type { PartRatingsInput } from '../reckoners/part-ratings';
import type { TransformerLoadingInput } from '../reckoners/transformer-loading';
import { formatNumber, formatQuantity } from '../units/format';
import { linearAxis, RECKONER_FRAME, type PlotBlock, type PlotModel } from './reckoner-plot';

/** Bars run right from a wider left margin, where each row is named. */
export const BAR_FRAME = { ...RECKONER_FRAME, left: 170, rowHeight: 36 };
const BAR_HALF = 0.3;

interface BarRow {
  key: string;
  name: string;
  value: number;
  /** The rating the value is held against, if any. */
  rating?: number;
  /** From here to the rating is "close": shaded. */
  near?: number;
  /** The words beside the bar, when not the value in the axis's unit. */
  text?: string;
}

const shorten = (s: string, n: number) => (s.length > n ? `${s.slice(0, n - 1)}…` : s);

/** Horizontal bars of a load, each against its rating (a dashed line and a hollow diamond). */
function barsPlot(o: {
  plot: string;
  title: string;
  unit: string;
  axisLabel: string;
  rows: BarRow[];
  description: string;
  caption?: string;
  /** The figures as a table, when not the load and rating in the axis's unit. */
  table?: PlotModel['table'];
}): PlotModel {
  const f = BAR_FRAME;
  const height = f.top + o.rows.length * f.rowHeight + f.bottom;
  const q = (v: number) => formatQuantity(v, o.unit, 3);
  const x = linearAxis(
    [0, ...o.rows.flatMap((r) => [r.value, r.rating ?? 0])],
    [f.left, f.width - f.right],
    o.axisLabel,
  );
  const yScale = scaleLinear<number>({
    domain: [-0.5, o.rows.length - 0.5],
    range: [f.top, height - f.bottom],
  });
  const y = {
    scale: yScale,
    ticks: o.rows.map((_, i) => i),
    format: (i: number) => shorten(o.rows[i]?.name ?? '', 22),
    label: '',
  };
  const px = (v: number) => x.scale(v)!;
  const rated = o.rows.filter((r) => r.rating !== undefined);
  const over = rated.filter((r) => r.value > r.rating!);
  return {
    plot: o.plot,
    title: o.title,
    description:
      o.description +
      (rated.length
        ? over.length
          ? ` Over its rating: ${over.map((r) => r.name).join(', ')}.`
          : ' Everything is within its rating.'
        : ''),
    caption:
      o.caption ??
      'Bars: the load. Dashed line and hollow diamond: the rating it is held against. Shaded: the margin ' +
        'close to the rating.',
    width: f.width,
    height,
    x,
    y,
    grid: 'columns',
    bars: o.rows.map((r, i) => ({
      key: r.key,
      x0: px(0),
      x1: px(r.value),
      y0: yScale(i - BAR_HALF),
      y1: yScale(i + BAR_HALF),
      title: `${r.name}: ${q(r.value)}${r.rating === undefined ? '' : ` of ${q(r.rating)} rated`}`,
    })),
    bands: o.rows.flatMap((r, i) =>
      r.near === undefined || r.rating === undefined
        ? []
        : [
            {
              key: r.key,
              x0: px(r.near),
              x1: px(r.rating),
              y0: yScale(i - 0.45),
              y1: yScale(i + 0.45),
              title: `${r.name}: close to the rating above ${q(r.near)}`,
            },
          ],
    ),
    lines: rated.map((r) => {
      const i = o.rows.indexOf(r);
      return {
        key: `${r.key}-rating`,
        points: [
          [px(r.rating!), yScale(i - 0.45)],
          [px(r.rating!), yScale(i + 0.45)],
        ] as [number, number][],
        style: 'dashed' as const,
        strong: true,
        title: `${r.name}: rating ${q(r.rating!)}`,
      };
    }),
    marks: rated.map((r) => ({
      key: `${r.key}-rating`,
      x: px(r.rating!),
      y: yScale(o.rows.indexOf(r) - 0.45),
      shape: 'diamond' as const,
      title: `${r.name}: rating ${q(r.rating!)}`,
    })),
    labels: o.rows.map((r, i) => ({
      key: r.key,
      x: px(r.value) + 6,
      y: yScale(i) + 4,
      text: r.text ?? q(r.value),
      anchor: 'start' as const,
    })),
    legend: [
      { sign: { bar: true }, text: 'load' },
      ...(rated.length ? [{ sign: { shape: 'diamond' as const }, text: 'rating' }] : []),
      ...(o.rows.some((r) => r.near !== undefined)
        ? [{ sign: { band: true as const }, text: 'close to the rating' }]
        : []),
    ],
    table: o.table ?? {
      label: 'The plotted figures as a table',
      columns: ['', `Load (${o.unit})`, 'Rating', 'Share of rating'],
      rows: o.rows.map((r) => ({
        key: r.key,
        cells: [
          r.name,
          q(r.value),
          r.rating === undefined ? '—' : q(r.rating),
          r.rating === undefined ? '—' : `${Math.round((100 * r.value) / r.rating)} %`,
        ],
      })),
    },
  };
}

/** Heater current per valve line and in all, against the heater winding's rating. */
export function heaterPlot(block: PlotBlock): PlotModel {
  const input = block.input as HeaterBudgetInput;
  const total = block.outputs.totalCurrent!.value as number;
  const series = input.arrangement === 'series';
  const rows: BarRow[] = [
    ...(series
      ? []
      : input.heaters.map((h, i) => ({
          key: `heater${i + 1}`,
          name: `${h.label || `Heater ${i + 1}`}${h.count > 1 ? ` × ${h.count}` : ''}`,
          value: h.amps * h.count,
        }))),
    {
      key: 'total',
      name: series ? 'Series string' : 'All heaters',
      value: total,
      rating: input.windingCurrent,
      near: (input.nearLimit / 100) * input.windingCurrent,
    },
  ];
  return barsPlot({
    plot: 'heater-budget',
    title: `${block.name}: heater current against the winding rating`,
    unit: 'A',
    axisLabel: 'Heater current (A rms)',
    rows,
    description: `${formatQuantity(total, 'A', 3)} rms drawn from a winding rated ${formatQuantity(input.windingCurrent, 'A', 3)}.`,
  });
}

/** Load per secondary winding against its rated current (as VA), and the total against the transformer's rating. */
export function transformerPlot(block: PlotBlock): PlotModel {
  const input = block.input as TransformerLoadingInput;
  const total = block.outputs.totalVA!.value as number;
  return barsPlot({
    plot: 'transformer-loading',
    title: `${block.name}: load per winding against its rating`,
    unit: 'VA',
    axisLabel: 'Load (VA)',
    rows: [
      ...input.windings.map((w, i) => ({
        key: `winding${i + 1}`,
        name: w.label || `Winding ${i + 1}`,
        value: block.outputs[`winding${i + 1}.va`]!.value as number,
        ...(w.ratedAmps !== undefined && { rating: w.volts * w.ratedAmps }),
      })),
      {
        key: 'total',
        name: 'All windings',
        value: total,
        ...(input.ratedVA !== undefined && { rating: input.ratedVA }),
      },
    ],
    description: `${formatQuantity(total, 'VA', 3)} in all over ${input.windings.length} ${input.windings.length === 1 ? 'winding' : 'windings'}${input.ratedVA === undefined ? '' : ` of a ${formatQuantity(input.ratedVA, 'VA', 3)} transformer`}.`,
  });
}

/**
 * Each part's stress at high mains as a share of its rating, on one axis (volts, watts and amps
 * side by side): 100 % is the rating, and a resistor's derating is shaded up to it. Null when no part
 * has a rating to hold it against.
 */
export function partsPlot(block: PlotBlock): PlotModel | null {
  const input = block.input as PartRatingsInput;
  const o = block.outputs;
  const peak = o.noLoadPeakHigh!.value as number;
  const parts: (BarRow & { stress: string; rated: string })[] = [];
  const add = (key: string, name: string, stress: number, rating: number, unit: string, near?: number) =>
    parts.push({
      key,
      name,
      value: (100 * stress) / rating,
      rating: 100,
      ...(near !== undefined && { near }),
      text: `${formatQuantity(stress, unit, 3)} (${formatNumber((100 * stress) / rating, 3)} %)`,
      stress: formatQuantity(stress, unit, 3),
      rated: formatQuantity(rating, unit, 3),
    });
  input.capacitors.forEach((c, i) =>
    add(`capacitor${i + 1}`, c.label || `Capacitor ${i + 1}`, peak, c.rating, 'V'),
  );
  if (input.reservoirRippleRating !== undefined)
    add(
      'ripple',
      'Reservoir ripple current',
      o.reservoirRippleCurrent!.value as number,
      input.reservoirRippleRating,
      'A',
    );
  input.resistors.forEach((r, i) => {
    const name = r.label || `Resistor ${i + 1}`;
    add(
      `resistor${i + 1}`,
      `${name}: power`,
      o[`resistor${i + 1}.dissipation`]!.value as number,
      r.powerRating,
      'W',
      input.resistorDerating,
    );
    if (r.voltageLimit !== undefined)
      add(
        `resistor${i + 1}-volts`,
        `${name}: voltage`,
        Math.max(r.current * r.resistance, peak),
        r.voltageLimit,
        'V',
      );
  });
  if (input.diodePiv !== undefined && o.diodePiv)
    add('piv', 'Diode reverse voltage', o.diodePiv.value as number, input.diodePiv, 'V');
  if (input.diodeSurge !== undefined && o.diodeSurgePeak)
    add('surge', 'Diode surge', o.diodeSurgePeak.value as number, input.diodeSurge, 'A');
  if (parts.length === 0) return null;
  return barsPlot({
    plot: 'part-ratings',
    title: `${block.name}: each part’s stress against its rating at high mains`,
    unit: '%',
    axisLabel: 'Stress at high mains (% of the rating)',
    rows: parts,
    description: `${parts.length} ${parts.length === 1 ? 'part' : 'parts'} at +${formatNumber(input.highMains)} % mains, the capacitors at the no-load peak of ${formatQuantity(peak, 'V', 4)}.`,
    caption:
      'Bars: each part’s stress as a share of its rating. Dashed line and hollow diamond: the rating (100 %). ' +
      `Shaded: a resistor’s power above the shop’s derating (${formatNumber(input.resistorDerating)} % of its rating).`,
    table: {
      label: 'The plotted figures as a table',
      columns: ['Part', 'Stress at high mains', 'Rating', 'Share of rating'],
      rows: parts.map((r) => ({
        key: r.key,
        cells: [r.name, r.stress, r.rated, `${formatNumber(r.value, 3)} %`],
      })),
    },
  });
}
