import { scaleLinear } from '@visx/scale';
import type { ResolvedReading } from '../document/evaluate';
import type { DropperLadderInput } from '../reckoners/dropper-ladder';
import { formatQuantity } from '../units/format';
import {
  FRAME_X,
  FRAME_Y,
  linearAxis,
  readingsOf,
  RECKONER_FRAME,
  type PlotBlock,
  type PlotModel,
} from './reckoner-plot';

/** Share of a node's column a band or a step's words take. */
const BAND_HALF = 0.28;

interface LadderNode {
  key: string;
  name: string;
  volts: number;
  target: number | null;
  bands: ResolvedReading[];
}

const shorten = (s: string, n: number) => (s.length > n ? `${s.slice(0, Math.max(1, n - 1))}…` : s);

/** The B+ ladder as a staircase: the start node, then each stage's node voltage, with the readings' bands on them. */
export function ladderPlot(block: PlotBlock, readings: readonly ResolvedReading[]): PlotModel {
  const input = block.input as DropperLadderInput;
  // A start voltage taken from another block's output carries that output's readings too.
  const startRef = block.sources.startVoltage;
  const nodes: LadderNode[] = [
    {
      key: 'start',
      name: 'Start',
      volts: input.startVoltage,
      target: null,
      bands: startRef?.kind === 'ref' ? readingsOf(startRef.ref, readings) : [],
    },
    ...input.stages.map((st, i) => ({
      key: `stage${i + 1}`,
      name: st.label || `Stage ${i + 1}`,
      volts: block.outputs[`stage${i + 1}.nodeVoltage`]!.value as number,
      target: st.targetVoltage,
      bands: readingsOf(`${block.name}.stage${i + 1}.nodeVoltage`, readings),
    })),
  ];
  const v = (volts: number) => formatQuantity(volts, 'V', 4);
  const scale = scaleLinear<number>({ domain: [-0.5, nodes.length - 0.5], range: FRAME_X });
  const x = {
    scale,
    ticks: nodes.map((_, i) => i),
    // A name longer than its column is cut (the table and the marks' titles keep it whole).
    format: (i: number) =>
      shorten(nodes[i]?.name ?? '', Math.floor((FRAME_X[1] - FRAME_X[0]) / nodes.length / 6.8)),
    label: 'Filter node, from the reservoir onwards',
  };
  const y = linearAxis(
    nodes.flatMap((n) => [
      n.volts,
      ...(n.target === null ? [] : [n.target]),
      ...n.bands.flatMap((b) => [b.low!, b.high!]),
    ]),
    FRAME_Y,
    'Node voltage (V DC)',
  );
  const px = (i: number) => scale(i);
  const py = (volts: number) => y.scale(volts)!;
  const stair: [number, number][] = nodes.flatMap((n, i) => [
    [px(i - 0.5), py(n.volts)],
    [px(i + 0.5), py(n.volts)],
  ]);
  const bandsOf = (n: LadderNode, i: number) =>
    n.bands.map((r) => ({
      key: `${n.key}-${r.id}`,
      x0: px(i - BAND_HALF),
      x1: px(i + BAND_HALF),
      y0: py(r.high!),
      y1: py(r.low!),
      title: `${r.label}: ${r.bandText ?? `${v(r.low!)} … ${v(r.high!)}`}`,
    }));
  const withBands = nodes.filter((n) => n.bands.length).length;
  return {
    plot: 'ladder',
    title: `${block.name}: node voltages down the ladder`,
    description:
      `${nodes.length} nodes from ${v(nodes[0]!.volts)} at the start to ${v(nodes.at(-1)!.volts)}: ` +
      nodes.map((n) => `${n.name} ${v(n.volts)}`).join(', ') +
      `. ${withBands ? `${withBands} ${withBands === 1 ? 'node carries' : 'nodes carry'} a reading’s tolerance band.` : 'No reading checks these nodes.'}`,
    caption:
      'Solid steps and circles: each node’s computed voltage. Hollow diamonds: the stage’s target. ' +
      'Shaded: the tolerance band of a reading checking that node.',
    width: RECKONER_FRAME.width,
    height: RECKONER_FRAME.height,
    x,
    y,
    bands: nodes.flatMap(bandsOf),
    lines: [{ key: 'steps', points: stair, style: 'solid', strong: true }],
    marks: [
      ...nodes.flatMap((n, i) =>
        n.target === null
          ? []
          : [
              {
                key: `${n.key}-target`,
                x: px(i),
                y: py(n.target),
                shape: 'diamond' as const,
                title: `${n.name}: target ${v(n.target)}`,
              },
            ],
      ),
      ...nodes.map((n, i) => ({
        key: n.key,
        x: px(i),
        y: py(n.volts),
        shape: 'circle' as const,
        title: `${n.name}: ${v(n.volts)}`,
      })),
    ],
    labels: nodes.map((n, i) => ({
      key: n.key,
      x: px(i) + 10,
      y: py(n.volts) - 8,
      text: v(n.volts),
      anchor: 'start' as const,
    })),
    legend: [
      { sign: { shape: 'circle' }, text: 'node voltage' },
      { sign: { shape: 'diamond' }, text: 'target' },
      { sign: { band: true }, text: 'reading’s band' },
    ],
    table: {
      label: 'The plotted figures as a table',
      columns: ['Node', 'Computed (V DC)', 'Target', 'Reading’s band'],
      rows: nodes.map((n) => ({
        key: n.key,
        cells: [
          n.name,
          v(n.volts),
          n.target === null ? '—' : v(n.target),
          n.bands.map((r) => `${r.label}: ${r.bandText ?? `${v(r.low!)} … ${v(r.high!)}`}`).join('; ') || '—',
        ],
      })),
    },
  };
}
