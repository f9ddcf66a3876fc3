import { scaleLinear } from '@visx/scale';
import type { RectifierSubstitutionInput } from '../reckoners/rectifier-substitution';
import { formatQuantity } from '../units/format';
import {
  FRAME_X,
  FRAME_Y,
  linearAxis,
  RECKONER_FRAME,
  type PlotBlock,
  type PlotModel,
} from './reckoner-plot';

const shorten = (s: string, n: number) => (s.length > n ? `${s.slice(0, Math.max(1, n - 1))}…` : s);

/**
 * B+ at each filter node with the fitted rectifier and with the new one, as two staircases (the
 * ladder's picture, docs/references.md §10), with the no-load peak at high mains the parts must stand.
 * Nothing to draw without nodes.
 */
export function substitutionPlot(block: PlotBlock): PlotModel | null {
  const input = block.input as RectifierSubstitutionInput;
  if (input.nodes.length === 0) return null;
  const nodes = input.nodes.map((n, i) => ({
    key: `node${i + 1}`,
    name: n.label || `Node ${i + 1}`,
    before: n.volts,
    after: block.outputs[`node${i + 1}.voltage`]!.value as number,
  }));
  const peak = block.outputs.noLoadPeakHigh!.value as number;
  const change = block.outputs.bplusChange!.value as number;
  const v = (volts: number) => formatQuantity(volts, 'V', 4);
  const scale = scaleLinear<number>({ domain: [-0.5, nodes.length - 0.5], range: FRAME_X });
  const x = {
    scale,
    ticks: nodes.map((_, i) => i),
    format: (i: number) =>
      shorten(nodes[i]?.name ?? '', Math.floor((FRAME_X[1] - FRAME_X[0]) / nodes.length / 6.8)),
    label: 'Filter node, from the reservoir onwards',
  };
  const y = linearAxis([...nodes.flatMap((n) => [n.before, n.after]), peak], FRAME_Y, 'Node voltage (V DC)');
  const py = (volts: number) => y.scale(volts)!;
  const stair = (pick: (n: (typeof nodes)[number]) => number): [number, number][] =>
    nodes.flatMap((n, i) => [
      [scale(i - 0.5), py(pick(n))],
      [scale(i + 0.5), py(pick(n))],
    ]);
  const [x0, x1] = FRAME_X;
  const newName = input.to === 'silicon' ? 'silicon' : 'new valve';
  return {
    plot: 'rectifier-substitution',
    title: `${block.name}: B+ at each node, before and after`,
    description:
      `Every node moves ${change >= 0 ? 'up' : 'down'} by ${v(Math.abs(change))} with the ${newName} rectifier: ` +
      nodes.map((n) => `${n.name} ${v(n.before)} → ${v(n.after)}`).join(', ') +
      `. With no load at high mains the filter sits at ${v(peak)}.`,
    caption:
      'Dashed steps and squares: each node with the fitted rectifier. Solid steps and circles: with the new one. ' +
      'Dotted: the no-load peak at high mains.',
    width: RECKONER_FRAME.width,
    height: RECKONER_FRAME.height,
    x,
    y,
    bands: [],
    lines: [
      { key: 'before', points: stair((n) => n.before), style: 'dashed', title: 'With the fitted rectifier' },
      {
        key: 'after',
        points: stair((n) => n.after),
        style: 'solid',
        strong: true,
        title: `With the ${newName} rectifier`,
      },
      {
        key: 'peak',
        points: [
          [x0, py(peak)],
          [x1, py(peak)],
        ],
        style: 'dotted',
        title: `No-load peak at high mains: ${v(peak)}`,
      },
    ],
    marks: nodes.flatMap((n, i) => [
      {
        key: `${n.key}-before`,
        x: scale(i),
        y: py(n.before),
        shape: 'square' as const,
        title: `${n.name}, fitted: ${v(n.before)}`,
      },
      {
        key: `${n.key}-after`,
        x: scale(i),
        y: py(n.after),
        shape: 'circle' as const,
        title: `${n.name}, new: ${v(n.after)}`,
      },
    ]),
    labels: [
      ...nodes.map((n, i) => ({
        key: n.key,
        x: scale(i) + 10,
        y: py(Math.max(n.after, n.before)) - 8,
        text: v(n.after),
        anchor: 'start' as const,
      })),
      { key: 'peak', x: x1 - 4, y: py(peak) - 6, text: `no load, high mains ${v(peak)}`, anchor: 'end' },
    ],
    legend: [
      { sign: { shape: 'square' }, text: 'fitted rectifier' },
      { sign: { shape: 'circle' }, text: `${newName} rectifier` },
      { sign: { line: 'dotted' }, text: 'no-load peak, high mains' },
    ],
    table: {
      label: 'The plotted figures as a table',
      columns: ['Node', 'Fitted (V DC)', 'New (V DC)', 'Change'],
      rows: nodes.map((n) => ({
        key: n.key,
        cells: [n.name, v(n.before), v(n.after), v(n.after - n.before)],
      })),
    },
  };
}
