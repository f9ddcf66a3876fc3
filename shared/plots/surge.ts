import type { SwitchOnSurgeInput } from '../reckoners/switch-on-surge';
import { formatNumber, formatQuantity } from '../units/format';
import {
  FRAME_X,
  FRAME_Y,
  linearAxis,
  logAxis,
  RECKONER_FRAME,
  type PlotBlock,
  type PlotModel,
} from './reckoner-plot';

/** Time constants drawn: by five the surge has delivered all but 0.005 % of its I²t. */
const TAUS = 5;
const SAMPLES = 120;
/** Further apart than this and the I²t axis goes logarithmic, so neither the surge nor the fuse sits on the floor. */
const LOG_RATIO = 20;

/**
 * The switch-on surge in the fuse, i = I_pk e^(−t/τ), as the I²t it has delivered since switch-on,
 * ∫ i² dt = I_pk² τ/2 (1 − e^(−2t/τ)), against the fuse's pre-arcing I²t: the fuse opens where the
 * curve crosses that line (pulse I²t against the fuse's melting I²t, docs/references.md §1). Only
 * for a surge worked from the circuit.
 */
export function surgePlot(block: PlotBlock): PlotModel | null {
  const input = block.input as SwitchOnSurgeInput;
  const peak = block.outputs.primaryPeak?.value;
  const tau = block.outputs.timeConstant?.value;
  if (
    block.outputs.method?.value !== 'from the circuit' ||
    typeof peak !== 'number' ||
    typeof tau !== 'number'
  )
    return null;
  return surgeLayout(block.name, peak, tau, input.fuseI2t);
}

/**
 * The mains-fuse block's surge, where it was worked from the circuit: the same picture against the
 * fuse's pre-arcing I²t it used (the maker's figure, or the IEC 60127-2 minimum; docs/references.md §1).
 */
export function fuseSurgePlot(block: PlotBlock): PlotModel | null {
  const peak = block.outputs.surgePeak?.value;
  const tau = block.outputs.surgeTimeConstant?.value;
  const fuse = block.outputs.fusePreArcingI2t?.value;
  if (typeof peak !== 'number' || typeof tau !== 'number') return null;
  return surgeLayout(block.name, peak, tau, typeof fuse === 'number' ? fuse : undefined);
}

function surgeLayout(name: string, peak: number, tau: number, fuse: number | undefined): PlotModel {
  const total = (peak * peak * tau) / 2;
  const upTo = (t: number) => total * (1 - Math.exp((-2 * t) / tau));
  const ms = (s: number) => s * 1000;
  const i2t = (v: number) => formatQuantity(v, 'A²s', 3);
  const x = linearAxis([0, ms(TAUS * tau)], FRAME_X, 'Time after switch-on (ms)');
  const values = [total, ...(fuse === undefined ? [] : [fuse])];
  const log = Math.max(...values) / Math.min(...values) > LOG_RATIO;
  const yLabel = `I²t delivered to the fuse (A²s${log ? ', log scale' : ''})`;
  const y = log
    ? logAxis([Math.min(...values) / 100, Math.max(...values)], FRAME_Y, yLabel)
    : linearAxis([0, ...values], FRAME_Y, yLabel);
  const floor = (y.scale.domain() as number[])[0]!;
  const [x0, x1] = x.scale.range() as [number, number];
  const px = (seconds: number) => x.scale(ms(seconds))!;
  const py = (v: number) => y.scale(Math.max(v, floor))!;
  const tEnd = (x.scale.domain() as number[])[1]! / 1000;
  // Where the delivered I²t reaches the fuse's: t = −τ/2 ln(1 − I²t_fuse / total).
  const opens = fuse !== undefined && fuse < total ? (-tau / 2) * Math.log(1 - fuse / total) : null;
  const curve: [number, number][] = Array.from({ length: SAMPLES + 1 }, (_, i) => {
    const t = (tEnd * i) / SAMPLES;
    return [px(t), py(upTo(t))];
  });
  const amps = formatQuantity(peak, 'A', 3);
  return {
    plot: 'surge',
    title: `${name}: switch-on surge against the fuse`,
    description:
      `A ${amps} peak surge in the primary decaying with a ${formatQuantity(tau, 's', 3)} time constant delivers ` +
      `${i2t(total)} in all` +
      (fuse === undefined
        ? '; no fuse pre-arcing I²t was given.'
        : opens !== null
          ? `, more than the fuse’s ${i2t(fuse)} pre-arcing I²t: it can open ${formatQuantity(opens, 's', 2)} after switch-on.`
          : `, ${formatNumber(fuse / total, 2)} × below the fuse’s ${i2t(fuse)} pre-arcing I²t.`),
    caption:
      'Solid: the I²t the charging surge has delivered to the fuse since switch-on. Dotted: all of it. ' +
      'Dashed: the fuse’s pre-arcing I²t; a triangle where the surge would reach it.',
    width: RECKONER_FRAME.width,
    height: RECKONER_FRAME.height,
    x,
    y,
    bands: [],
    lines: [
      { key: 'surge', points: curve, style: 'solid', strong: true },
      {
        key: 'total',
        points: [
          [x0, py(total)],
          [x1, py(total)],
        ],
        style: 'dotted',
        title: `All of the surge: ${i2t(total)}`,
      },
      ...(fuse === undefined
        ? []
        : [
            {
              key: 'fuse',
              points: [
                [x0, py(fuse)],
                [x1, py(fuse)],
              ] as [number, number][],
              style: 'dashed' as const,
              title: `Fuse pre-arcing I²t: ${i2t(fuse)}`,
            },
          ]),
    ],
    marks:
      opens === null
        ? []
        : [
            {
              key: 'opens',
              x: px(opens),
              y: py(fuse!),
              shape: 'triangle',
              title: `The surge reaches the fuse’s pre-arcing I²t ${formatQuantity(opens, 's', 2)} after switch-on`,
            },
          ],
    labels: [
      { key: 'total', x: x1 - 4, y: py(total) - 6, text: `surge ${i2t(total)}`, anchor: 'end' },
      ...(fuse === undefined
        ? []
        : [{ key: 'fuse', x: x1 - 4, y: py(fuse) + 16, text: `fuse ${i2t(fuse)}`, anchor: 'end' as const }]),
    ],
    legend: [
      { sign: { line: 'solid', strong: true }, text: 'surge I²t so far' },
      ...(fuse === undefined ? [] : [{ sign: { line: 'dashed' as const }, text: 'fuse pre-arcing I²t' }]),
      ...(opens === null ? [] : [{ sign: { shape: 'triangle' as const }, text: 'fuse would open' }]),
    ],
    table: {
      label: 'The plotted figures as a table',
      columns: ['Figure', 'Value'],
      rows: [
        ['peak', 'Peak surge in the primary', `${amps} peak`],
        ['tau', 'Time constant', formatQuantity(tau, 's', 3)],
        ['total', 'Surge I²t in the fuse, all of it', i2t(total)],
        ['fuse', 'Fuse pre-arcing I²t', fuse === undefined ? '—' : i2t(fuse)],
        ['opens', 'Fuse would open after', opens === null ? '—' : formatQuantity(opens, 's', 2)],
      ].map(([key, ...cells]) => ({ key: key!, cells: cells as string[] })),
    },
  };
}
