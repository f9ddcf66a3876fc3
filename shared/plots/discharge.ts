import type { BleederInput } from '../reckoners/bleeder';
import { formatQuantity } from '../units/format';
import {
  FRAME_X,
  FRAME_Y,
  linearAxis,
  logAxis,
  RECKONER_FRAME,
  type PlotBlock,
  type PlotModel,
} from './reckoner-plot';

/** Below this share of the charged voltage a threshold would sit on the floor of a linear axis: the axis goes logarithmic. */
export const LOG_BELOW = 1 / 20;
const SAMPLES = 120;

/** A bleeder block's discharge curve after switch-off, down past the hazard threshold and each further threshold. */
export function dischargePlot(block: PlotBlock): PlotModel | null {
  const input = block.input as BleederInput;
  if (input.bleederResistance === undefined) return null;
  const { chargedVoltage: v0, threshold, capacitance } = input;
  const tau = input.bleederResistance * capacitance;
  const at = (t: number) => v0 * Math.exp(-t / tau);
  const timeOf = (key: string) => block.outputs[key]?.value as number | undefined;
  const v = (volts: number) => formatQuantity(volts, 'V', 3);
  const s = (secs: number) => formatQuantity(secs, 's', 3);
  const stops = [
    { key: 'hazard', name: 'hazard threshold', volts: threshold, time: timeOf('timeToThreshold')! },
    ...input.milestones.map((m, i) => ({
      key: `milestone${i + 1}`,
      name: m.label || `threshold ${i + 1}`,
      volts: m.volts,
      time: timeOf(`milestone${i + 1}`)!,
    })),
  ];
  const elapsed =
    input.elapsed !== undefined ? { time: input.elapsed, volts: timeOf('voltageAfter')! } : null;
  const end = Math.max(tau, ...stops.map((x) => x.time), elapsed?.time ?? 0) * 1.15;
  const lowest = Math.min(...stops.map((x) => x.volts), elapsed?.volts ?? v0);
  const log = lowest < v0 * LOG_BELOW;
  const x = linearAxis([0, end], FRAME_X, 'Time after switch-off (s)');
  const yLabel = `Voltage left on the capacitor (V DC${log ? ', log scale' : ''})`;
  const y = log ? logAxis([lowest, v0], FRAME_Y, yLabel) : linearAxis([0, v0], FRAME_Y, yLabel);
  const [x0, x1] = x.scale.range() as [number, number];
  const px = (t: number) => x.scale(t)!;
  const py = (volts: number) => y.scale(volts)!;
  const tEnd = (x.scale.domain() as number[])[1]!;
  const curve: [number, number][] = Array.from({ length: SAMPLES + 1 }, (_, i) => {
    const t = (tEnd * i) / SAMPLES;
    return [px(t), py(Math.max(at(t), (y.scale.domain() as number[])[0]!))];
  });
  return {
    plot: 'discharge',
    title: `${block.name}: discharge after switch-off`,
    description:
      `From ${v(v0)} through ${formatQuantity(input.bleederResistance, 'Ω')} with a time constant of ${s(tau)}: ` +
      stops.map((x) => `below ${v(x.volts)} (${x.name}) after ${s(x.time)}`).join(', ') +
      (elapsed ? `; ${v(elapsed.volts)} left ${s(elapsed.time)} after switch-off.` : '.'),
    caption:
      'Solid: the capacitor voltage, V₀ e^(−t ÷ RC). Dashed and a triangle: the hazard threshold and when the ' +
      'voltage falls below it. Dotted and squares: the further thresholds.' +
      (elapsed ? ' Hollow diamond: the voltage at the time asked for.' : ''),
    width: RECKONER_FRAME.width,
    height: RECKONER_FRAME.height,
    x,
    y,
    bands: [],
    lines: [
      { key: 'curve', points: curve, style: 'solid', strong: true },
      ...stops.map((x) => ({
        key: x.key,
        points: [
          [x0, py(x.volts)],
          [x1, py(x.volts)],
        ] as [number, number][],
        style: x.key === 'hazard' ? ('dashed' as const) : ('dotted' as const),
        title: `${x.name}: ${v(x.volts)}`,
      })),
    ],
    marks: [
      ...stops.map((x) => ({
        key: x.key,
        x: px(x.time),
        y: py(x.volts),
        shape: x.key === 'hazard' ? ('triangle' as const) : ('square' as const),
        title: `Below ${v(x.volts)} (${x.name}) after ${s(x.time)}`,
      })),
      ...(elapsed
        ? [
            {
              key: 'elapsed',
              x: px(elapsed.time),
              y: py(elapsed.volts),
              shape: 'diamond' as const,
              title: `${v(elapsed.volts)} after ${s(elapsed.time)}`,
            },
          ]
        : []),
    ],
    labels: stops.map((x) => ({
      key: x.key,
      x: px(x.time) + 10,
      y: py(x.volts) - 8,
      text: `${v(x.volts)} at ${s(x.time)}`,
      anchor: 'start' as const,
    })),
    legend: [
      { sign: { line: 'solid', strong: true }, text: 'capacitor voltage' },
      { sign: { shape: 'triangle' }, text: 'hazard threshold' },
      ...(stops.length > 1 ? [{ sign: { shape: 'square' as const }, text: 'further threshold' }] : []),
    ],
    table: {
      label: 'The plotted figures as a table',
      columns: ['Threshold', 'Voltage', 'Reached after'],
      rows: [
        ...stops.map((x) => ({ key: x.key, cells: [x.name, v(x.volts), s(x.time)] })),
        ...(elapsed
          ? [{ key: 'elapsed', cells: ['at the time asked for', v(elapsed.volts), s(elapsed.time)] }]
          : []),
        { key: 'tau', cells: ['time constant (to 37 %)', v(v0 / Math.E), s(tau)] },
      ],
    },
  };
}
