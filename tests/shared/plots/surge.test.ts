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

describe('the mains fuse’s surge, worked from the circuit', () => {
  // 300 V winding, 61 Ω at the secondary, 470 µF on 230 V mains, 1 A time-lag fuse (margin 1):
  // I_pk = √2 × 300 ÷ 61 × 300/230, τ = 61 × 470 µF; the fuse held to (10 × 1 A)² × 10 ms = 1 A²s (docs/references.md §1).
  const fuseBlock = evaluatedBlock('mains-fuse', 'fuse', {
    load: 'va',
    va: `${0.85 * 230} VA`,
    mainsVoltage: '230 V',
    margin: 1,
    surgeWindingVoltage: '300 V',
    surgeSourceResistance: '61 Ω',
    surgeReservoir: '470 µF',
  });
  const fuseModel = plotFor(fuseBlock)!;

  it('draws the surge in the primary against the fuse’s pre-arcing I²t', () => {
    const pk = ((Math.SQRT2 * 300) / 61) * (300 / 230);
    const t = 61 * 470e-6;
    const fd = fuseModel.y.scale.domain() as [number, number];
    const fr = fuseModel.y.scale.range() as [number, number];
    const line = (key: string) => fuseModel.lines.find((l) => l.key === key)!.points[0]![1];
    // On a linear axis: the whole surge at I_pk² τ / 2 and the fuse at 1 A²s.
    expect(lerp(line('total'), fr, fd)).toBeCloseTo((pk * pk * t) / 2, 6);
    expect(lerp(line('fuse'), fr, fd)).toBeCloseTo(1, 6);
    expect(fuseModel.marks.map((m) => m.shape)).toEqual(['triangle']);
  });

  it('draws nothing on the rule of thumb', () => {
    expect(
      plotFor(evaluatedBlock('mains-fuse', 'fuse', { load: 'va', va: '100 VA', mainsVoltage: '230 V' })),
    ).toBeNull();
  });
});
