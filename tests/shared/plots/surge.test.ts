import { describe, expect, it } from 'vitest';
import { plotFor } from '../../../shared/plots/reckoner-plots';
import { evaluatedBlock, expectRoundTicks, lerp } from './reckoner-plot-helpers';

const circuit = {
  windingVoltage: '300 V',
  mainsVoltage: '230 V',
  rectifier: 'silicon-bridge',
  secondaryResistance: '50',
  primaryResistance: '10',
  reservoir: '100u',
  mainsFrequency: '50 Hz',
};
const block = evaluatedBlock('switch-on-surge', 'surge', { ...circuit, fuseI2t: '0.1 A²s' });
const model = plotFor(block)!;
const peak = block.outputs.primaryPeak!.value as number;
const tau = block.outputs.timeConstant!.value as number;
const dom = (a: typeof model.x) => a.scale.domain() as [number, number];
const rng = (a: typeof model.x) => a.scale.range() as [number, number];
const ms = (px: number) => lerp(px, rng(model.x), dom(model.x));
const a2s = (py: number) => lerp(py, rng(model.y), dom(model.y));

/** ∫₀ᵗ i² dt of i = I_pk e^(−t/τ) by the trapezoid rule on a fine grid: not the closed form the layout uses. */
function integrated(t: number, steps = 20000) {
  const h = t / steps;
  let sum = 0;
  for (let k = 0; k <= steps; k++)
    sum += (k === 0 || k === steps ? 0.5 : 1) * (peak * Math.exp((-k * h) / tau)) ** 2;
  return sum * h;
}

describe('the switch-on surge against the fuse', () => {
  it('draws the I²t delivered since switch-on as numerical integration of the exponential gives it', () => {
    const curve = model.lines.find((l) => l.key === 'surge')!.points;
    for (const i of [0, 10, 30, 60, 120]) {
      const [x, y] = curve[i]!;
      expect(a2s(y)).toBeCloseTo(integrated(ms(x) / 1000), 4);
    }
    expect(model.x.label).toBe('Time after switch-on (ms)');
    expect(model.y.label).toBe('I²t delivered to the fuse (A²s)');
  });

  it('puts the fuse’s pre-arcing I²t as a dashed line, and a triangle where the surge reaches it', () => {
    const fuse = model.lines.find((l) => l.key === 'fuse')!;
    expect(fuse.style).toBe('dashed');
    expect(a2s(fuse.points[0]![1])).toBeCloseTo(0.1, 9);
    const [opens] = model.marks;
    expect(opens!.shape).toBe('triangle');
    expect(integrated(ms(opens!.x) / 1000)).toBeCloseTo(0.1, 4);
    expect(expectRoundTicks(model.x.ticks)).toEqual([]);
    expect(expectRoundTicks(model.y.ticks)).toEqual([]);
  });

  it('goes logarithmic when the fuse is far above the surge, and marks no opening', () => {
    const far = plotFor(evaluatedBlock('switch-on-surge', 'surge', { ...circuit, fuseI2t: '20 A²s' }))!;
    expect(far.y.label).toMatch(/log scale/);
    expect(far.marks).toEqual([]);
    expect(far.description).toMatch(/below the fuse’s 20 A²s/);
  });

  it('draws nothing for the rule-of-thumb figure', () => {
    const rough = evaluatedBlock('switch-on-surge', 'surge', {
      windingVoltage: '300 V',
      mainsVoltage: '230 V',
      reservoir: '100u',
      runningCurrent: '0.3 A',
    });
    expect(plotFor(rough)).toBeNull();
  });
});
