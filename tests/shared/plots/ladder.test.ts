import { describe, expect, it } from 'vitest';
import type { ResolvedReading } from '../../../shared/document/evaluate';
import { plotFor } from '../../../shared/plots/reckoner-plots';
import { evaluateProcedure } from '../../../shared/reckoners';
import { evaluatedBlock, expectRoundTicks, lerp, markup } from './reckoner-plot-helpers';

// Three RC stages with fitted resistors: each node is the one before less R × (its current and every later one's).
const block = evaluatedBlock('dropper-ladder', 'ladder', {
  startVoltage: '330 V',
  stages: [
    {
      label: 'Screens',
      targetVoltage: '300 V',
      current: '6 mA',
      capacitance: '32u',
      fittedResistance: '4k7',
    },
    {
      label: 'Phase inverter',
      targetVoltage: '270 V',
      current: '2.5 mA',
      capacitance: '22u',
      fittedResistance: '5k6',
    },
    { label: 'Preamp', targetVoltage: '240 V', current: '3 mA', capacitance: '22u', fittedResistance: '10k' },
  ],
  mainsFrequency: '50 Hz',
});
// Ohm's law by hand: 330 − 4700 × 0.0115 = 275.95; − 5600 × 0.0055 = 245.15; − 10000 × 0.003 = 215.15.
const expectedNodes = [330, 275.95, 245.15, 215.15];
const reading = (id: string, ref: string, low: number, high: number): ResolvedReading => ({
  id,
  label: id,
  testPoint: '',
  meterRange: '',
  unit: 'V',
  measure: 'dc',
  section: '',
  toleranceText: '±10 %',
  expectedSource: ref,
  expected: (low + high) / 2,
  low,
  high,
  bandText: null,
});
const readings = [
  reading('B+2', 'ladder.stage1.nodeVoltage', 248.4, 303.5),
  reading('B+4', 'ladder.stage3.nodeVoltage', 193.6, 236.7),
  reading('elsewhere', 'other.stage1.nodeVoltage', 10, 20),
];
const model = plotFor(block, readings)!;
const dom = (a: typeof model.x) => a.scale.domain() as [number, number];
const rng = (a: typeof model.x) => a.scale.range() as [number, number];
const py = (v: number) => lerp(v, dom(model.y), rng(model.y));
const px = (i: number) => lerp(i, dom(model.x), rng(model.x));

describe('the B+ ladder staircase', () => {
  it('steps down node by node to the voltages Ohm’s law gives, each step across its own column', () => {
    const steps = model.lines.find((l) => l.key === 'steps')!.points;
    expect(steps).toHaveLength(2 * expectedNodes.length);
    expectedNodes.forEach((volts, i) => {
      expect(steps[2 * i]![1]).toBeCloseTo(py(volts), 3);
      expect(steps[2 * i + 1]![1]).toBeCloseTo(py(volts), 3);
      expect(steps[2 * i]![0]).toBeCloseTo(px(i - 0.5), 6);
      expect(steps[2 * i + 1]![0]).toBeCloseTo(px(i + 0.5), 6);
      const node = model.marks.find((m) => m.key === (i ? `stage${i}` : 'start'))!;
      expect(node.shape).toBe('circle');
      expect(node.x).toBeCloseTo(px(i), 6);
      expect(node.y).toBeCloseTo(py(volts), 3);
    });
  });

  it('names each node under its column and marks each target with a different shape', () => {
    expect(model.x.ticks.map(model.x.format)).toEqual(['Start', 'Screens', 'Phase inverter', 'Preamp']);
    const targets = model.marks.filter((m) => m.shape === 'diamond');
    expect(targets.map((m) => m.y)).toEqual([300, 270, 240].map((v) => expect.closeTo(py(v), 6)));
  });

  it('draws the band of each reading that checks a node, over that node only', () => {
    expect(model.bands).toHaveLength(2);
    const [b2, b4] = model.bands;
    expect(b2!.y0).toBeCloseTo(py(303.5), 6);
    expect(b2!.y1).toBeCloseTo(py(248.4), 6);
    expect((b2!.x0 + b2!.x1) / 2).toBeCloseTo(px(1), 6);
    expect((b4!.x0 + b4!.x1) / 2).toBeCloseTo(px(3), 6);
    expect(model.table.rows[3]!.cells[3]).toMatch(/^B\+4: /);
    expect(markup(model).match(/data-band=/g)).toHaveLength(2);
  });

  it('has round voltage ticks covering every node, target and band', () => {
    expect(expectRoundTicks(model.y.ticks)).toEqual([]);
    expect(dom(model.y)[0]).toBeLessThanOrEqual(193.6);
    expect(dom(model.y)[1]).toBeGreaterThanOrEqual(330);
    expect(model.y.label).toBe('Node voltage (V DC)');
  });

  it('carries the band of the output the start node is taken from', () => {
    const { blocks } = evaluateProcedure([
      {
        kind: 'loaded-bplus',
        name: 'bplus',
        inputs: {
          windingVoltage: '250 V',
          sourceResistance: '60',
          reservoir: '47u',
          loadCurrent: '0.12 A',
          rectifier: 'silicon-bridge',
        },
      },
      {
        kind: 'dropper-ladder',
        name: 'ladder',
        inputs: {
          startVoltage: { ref: 'bplus.averageDc' },
          stages: [{ targetVoltage: '250 V', current: '10 mA', capacitance: '22u' }],
        },
      },
    ]);
    const linked = plotFor(blocks[1], [reading('B+1', 'bplus.averageDc', 280, 340)])!;
    expect(linked.bands).toHaveLength(1);
    expect((linked.bands[0]!.x0 + linked.bands[0]!.x1) / 2).toBeCloseTo(
      lerp(0, dom(linked.x), rng(linked.x)),
      6,
    );
    expect(linked.table.rows[0]!.cells[3]).toMatch(/^B\+1: /);
  });
});
