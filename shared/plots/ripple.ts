import { reservoirWaveform } from '../reckoners/capacitor-input';
import { loadedBplusCircuit, type LoadedBplusInput } from '../reckoners/loaded-bplus';
import { formatQuantity } from '../units/format';
import {
  FRAME_X,
  FRAME_Y,
  linearAxis,
  RECKONER_FRAME,
  type PlotBlock,
  type PlotModel,
} from './reckoner-plot';

/** Ripple periods drawn. */
export const RIPPLE_PERIODS = 2;
/** Points drawn per ripple period (the solver's 4000 steps thinned; the trough is always kept). */
const POINTS_PER_PERIOD = 200;

/** The reservoir voltage of a loaded-B+ block over two ripple periods, from the same solution as its outputs. */
export function ripplePlot(block: PlotBlock): PlotModel {
  const input = block.input as LoadedBplusInput;
  const w = reservoirWaveform(loadedBplusCircuit(input));
  const { averageDc, minimum, maximum, ripplePeakToPeak } = w.result;
  const n = w.volts.length - 1;
  const stride = Math.max(1, Math.floor(n / POINTS_PER_PERIOD));
  let trough = 0;
  for (let k = 1; k <= n; k++) if (w.volts[k]! < w.volts[trough]!) trough = k;
  const picks = [
    ...new Set([...Array.from({ length: Math.floor(n / stride) + 1 }, (_, i) => i * stride), n, trough]),
  ]
    .filter((k) => k <= n)
    .sort((a, b) => a - b);
  const ms = (s: number) => s * 1000;
  const samples: [number, number][] = [];
  for (let p = 0; p < RIPPLE_PERIODS; p++)
    for (const k of p === 0 ? picks : picks.slice(1))
      samples.push([ms(p * w.period + w.times[k]!), w.volts[k]!]);
  const x = linearAxis([0, ms(RIPPLE_PERIODS * w.period)], FRAME_X, 'Time from the mains zero crossing (ms)');
  const y = linearAxis([minimum, maximum], FRAME_Y, 'Reservoir voltage (V DC)');
  const [x0, x1] = x.scale.range() as [number, number];
  const px = (t: number) => x.scale(t)!;
  const py = (v: number) => y.scale(v)!;
  const troughs = Array.from({ length: RIPPLE_PERIODS }, (_, p) => ms(p * w.period + w.times[trough]!));
  const v = (volts: number) => formatQuantity(volts, 'V', 4);
  const freq = formatQuantity(1 / w.period, 'Hz');
  return {
    plot: 'ripple',
    title: `${block.name}: reservoir voltage over two ripple periods`,
    description:
      `The reservoir voltage rises while the rectifier conducts and falls as the load draws current, ` +
      `${RIPPLE_PERIODS} periods of the ${freq} ripple: average ${v(averageDc)}, trough ${v(minimum)}, ` +
      `crest ${v(maximum)}, ${v(ripplePeakToPeak)} peak to peak.`,
    caption:
      'Solid: the reservoir voltage from the loaded-B+ solution. Dashed: its average (the loaded B+). ' +
      'Triangles and the dotted line: the trough.',
    width: RECKONER_FRAME.width,
    height: RECKONER_FRAME.height,
    x,
    y,
    bands: [],
    lines: [
      { key: 'wave', points: samples.map(([t, volts]) => [px(t), py(volts)]), style: 'solid', strong: true },
      {
        key: 'average',
        points: [
          [x0, py(averageDc)],
          [x1, py(averageDc)],
        ],
        style: 'dashed',
        title: `Average ${v(averageDc)}`,
      },
      {
        key: 'trough',
        points: [
          [x0, py(minimum)],
          [x1, py(minimum)],
        ],
        style: 'dotted',
        title: `Trough ${v(minimum)}`,
      },
    ],
    marks: troughs.map((t, i) => ({
      key: `trough-${i}`,
      x: px(t),
      y: py(minimum),
      shape: 'triangle',
      title: `Trough ${v(minimum)} at ${formatQuantity(t / 1000, 's')}`,
    })),
    labels: [
      { key: 'average', x: x1 - 4, y: py(averageDc) - 6, text: `average ${v(averageDc)}`, anchor: 'end' },
      { key: 'trough', x: x1 - 4, y: py(minimum) + 16, text: `trough ${v(minimum)}`, anchor: 'end' },
    ],
    legend: [
      { sign: { line: 'solid', strong: true }, text: 'reservoir voltage' },
      { sign: { line: 'dashed' }, text: 'average (loaded B+)' },
      { sign: { shape: 'triangle' }, text: 'trough' },
    ],
    table: {
      label: 'The plotted figures as a table',
      columns: ['Figure', 'Value'],
      rows: [
        ['average', 'Average (loaded B+)', v(averageDc)],
        ['trough', 'Trough', v(minimum)],
        ['crest', 'Crest', v(maximum)],
        ['pp', 'Ripple, peak to peak', v(ripplePeakToPeak)],
        ['period', 'Ripple period', formatQuantity(w.period, 's', 3)],
      ].map(([key, ...cells]) => ({ key: key!, cells: cells as string[] })),
    },
  };
}
