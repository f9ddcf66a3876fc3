import type { ChokeInputInput } from '../reckoners/choke-input';
import { formatQuantity } from '../units/format';
import {
  FRAME_X,
  FRAME_Y,
  linearAxis,
  RECKONER_FRAME,
  type PlotBlock,
  type PlotModel,
} from './reckoner-plot';

/**
 * A choke-input supply's output against its load current: above the critical current the DC falls
 * slowly along the resistance drops from 0.9 × rms; below it the choke stops conducting all the time
 * and the output rises toward the no-load peak (docs/references.md §3). The rise is drawn as a
 * straight dotted line from the knee to the peak: only its ends are computed.
 */
export function chokePlot(block: PlotBlock): PlotModel {
  const input = block.input as ChokeInputInput;
  const o = block.outputs;
  const dcAtLoad = o.dcOutput!.value as number;
  const critical = o.minimumCurrent!.value as number;
  const peak = o.noLoadPeak!.value as number;
  const seriesR = input.chokeResistance + input.windingResistance;
  const I = input.loadCurrent;
  // Along the resistance drops, through the computed figure at the load current.
  const volts = (amps: number) => dcAtLoad + (I - amps) * seriesR;
  const mA = (a: number) => a * 1000;
  const top = Math.max(I, critical, input.lightestLoad ?? 0) * 1.25;
  const x = linearAxis([0, mA(top)], FRAME_X, 'Load current (mA DC)');
  const y = linearAxis([0, peak, volts(0)], FRAME_Y, 'Output voltage (V DC)');
  const end = (x.scale.domain() as number[])[1]! / 1000;
  const px = (a: number) => x.scale(mA(a))!;
  const py = (v: number) => y.scale(v)!;
  const [y0, y1] = y.scale.range() as [number, number];
  const v = (x: number) => formatQuantity(x, 'V', 4);
  const a = (x: number) => formatQuantity(x, 'A', 3);
  const light = input.lightestLoad;
  const belowCritical = (light ?? 0) < critical;
  return {
    plot: 'choke-input',
    title: `${block.name}: output voltage against load current`,
    description:
      `${v(dcAtLoad)} at ${a(I)}. Below ${a(critical)} (the critical current) the choke stops conducting all the time and the output rises toward ${v(peak)} with no load` +
      (light === undefined
        ? '.'
        : belowCritical
          ? `; the lightest load, ${a(light)}, is below it.`
          : `; the lightest load, ${a(light)}, stays above it.`),
    caption:
      'Solid: the output while the choke conducts all the time. Dotted: the rise toward the no-load peak below the critical current (shape indicative). ' +
      'Shaded: loads below the critical current. Triangle: the knee; circle: the load current; square: the lightest load.',
    width: RECKONER_FRAME.width,
    height: RECKONER_FRAME.height,
    x,
    y,
    bands: [
      {
        key: 'below-critical',
        x0: px(0),
        x1: px(critical),
        y0: y1,
        y1: y0,
        title: `Below the critical current, ${a(critical)}: the output soars toward the peak`,
      },
    ],
    lines: [
      {
        key: 'conducting',
        points: [
          [px(critical), py(volts(critical))],
          [px(end), py(volts(end))],
        ],
        style: 'solid',
        strong: true,
        title: 'Output with the choke conducting all the time',
      },
      {
        key: 'rise',
        points: [
          [px(0), py(peak)],
          [px(critical), py(volts(critical))],
        ],
        style: 'dotted',
        title: `Toward the no-load peak, ${v(peak)}`,
      },
    ],
    marks: [
      {
        key: 'knee',
        x: px(critical),
        y: py(volts(critical)),
        shape: 'triangle',
        title: `Critical current ${a(critical)}: ${v(volts(critical))}`,
      },
      {
        key: 'load',
        x: px(I),
        y: py(dcAtLoad),
        shape: 'circle',
        title: `Load current ${a(I)}: ${v(dcAtLoad)}`,
      },
      ...(light === undefined
        ? []
        : [
            {
              key: 'lightest',
              x: px(light),
              y: py(light >= critical ? volts(light) : peak - ((peak - volts(critical)) * light) / critical),
              shape: 'square' as const,
              title: `Lightest load ${a(light)}`,
            },
          ]),
    ],
    labels: [
      { key: 'peak', x: px(0) + 6, y: py(peak) - 8, text: `no load ${v(peak)}`, anchor: 'start' },
      { key: 'load', x: px(I), y: py(dcAtLoad) + 18, text: v(dcAtLoad), anchor: 'middle' },
    ],
    legend: [
      { sign: { line: 'solid', strong: true }, text: 'choke conducting' },
      { sign: { line: 'dotted' }, text: 'rising toward the peak' },
      { sign: { band: true }, text: 'below the critical current' },
      { sign: { shape: 'triangle' }, text: 'knee' },
      { sign: { shape: 'circle' }, text: 'load' },
      ...(light === undefined ? [] : [{ sign: { shape: 'square' as const }, text: 'lightest load' }]),
    ],
    table: {
      label: 'The plotted figures as a table',
      columns: ['Figure', 'Current', 'Output'],
      rows: [
        { key: 'no-load', cells: ['No load', a(0), v(peak)] },
        { key: 'knee', cells: ['Critical current (knee)', a(critical), v(volts(critical))] },
        { key: 'load', cells: ['Load current', a(I), v(dcAtLoad)] },
        ...(light === undefined
          ? []
          : [
              {
                key: 'lightest',
                cells: ['Lightest load', a(light), belowCritical ? 'toward the peak' : v(volts(light))],
              },
            ]),
      ],
    },
  };
}
