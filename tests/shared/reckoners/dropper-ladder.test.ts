import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { abs, add, complex, divide, type Complex } from 'mathjs';
import { rcAttenuation, suggestedPowerRating } from '../../../shared/reckoners/dropper-ladder';
import { expectClose, fieldErrors, num, run } from '../helpers';

/** IEC 60063 E24, typed literally from the standard's table [std; docs/references.md §4]. */
const E24_TABLE = [
  1.0, 1.1, 1.2, 1.3, 1.5, 1.6, 1.8, 2.0, 2.2, 2.4, 2.7, 3.0, 3.3, 3.6, 3.9, 4.3, 4.7, 5.1, 5.6, 6.2, 6.8,
  7.5, 8.2, 9.1,
];

/** Nearest E24 value on a logarithmic scale (the series is geometric) [derived]. */
function nearestE24(r: number): number {
  const decade = Math.floor(Math.log10(r));
  const candidates = [decade - 1, decade, decade + 1].flatMap((d) =>
    E24_TABLE.map((m) => Math.round(m * 10 ** d * 1e6) / 1e6),
  );
  return candidates.reduce((best, c) =>
    Math.abs(Math.log(c / r)) < Math.abs(Math.log(best / r)) ? c : best,
  );
}

describe('dropper-ladder', () => {
  it('350 V → 300 V at 20 mA: 2.5 kΩ, 1.0 W; E12 2.7 kΩ drops 54 V at 1.08 W [derived, docs/references.md §4]', () => {
    const { outputs } = run('dropper-ladder', {
      startVoltage: '350 V',
      stages: [{ targetVoltage: '300V', current: '20 mA', capacitance: '47u' }],
    });
    expectClose(num(outputs, 'stage1.resistanceExact'), 2500);
    expectClose(num(outputs, 'stage1.dissipationExact'), 1.0);
    expect(num(outputs, 'stage1.resistanceE12')).toBe(2700); // IEC 60063 E12 [std]
    expect(num(outputs, 'stage1.resistanceE24')).toBe(2400); // IEC 60063 E24 [std]
    expectClose(350 - num(outputs, 'stage1.nodeVoltage'), 54);
    expectClose(num(outputs, 'stage1.dissipation'), 1.08);
    // Rated at least twice the dissipation [common practice, no source]: 2.16 W → 3 W part
    expect(num(outputs, 'stage1.powerRating')).toBe(3);
  });

  it('each resistor carries its node’s current and every later node’s; E24 node voltages from the IEC 60063 table [derived: R = ΔV / I; std: IEC 60063 E24; docs/references.md §4]', () => {
    const { outputs } = run('dropper-ladder', {
      startVoltage: 400,
      series: 'E24',
      stages: [
        { targetVoltage: 350, current: '10 mA', capacitance: '47u' },
        { targetVoltage: 300, current: '5 mA', capacitance: '22u' },
        { targetVoltage: 250, current: '5 mA', capacitance: '22u' },
      ],
    });
    // Currents through each resistor: 10 + 5 + 5, 5 + 5, 5 mA; exact R = 50 V ÷ I.
    const through = [0.02, 0.01, 0.005];
    through.forEach((I, i) => {
      expectClose(num(outputs, `stage${i + 1}.current`), I);
      expectClose(num(outputs, `stage${i + 1}.resistanceExact`), 50 / I);
    });
    // Nearest E24 values, from the table typed here, on a log scale: 2.5 kΩ → 2.4 kΩ, 5 kΩ → 5.1 kΩ,
    // 10 kΩ → 10 kΩ; nodes 400 − 48 = 352 V, 352 − 51 = 301 V, 301 − 50 = 251 V.
    const fitted = through.map((I) => nearestE24(50 / I));
    expect(fitted).toEqual([2400, 5100, 10000]);
    let node = 400;
    fitted.forEach((R, i) => {
      node -= R * through[i]!;
      expect(num(outputs, `stage${i + 1}.resistanceE24`)).toBe(R);
      expectClose(num(outputs, `stage${i + 1}.nodeVoltage`), node, 1e-9);
    });
    expectClose(num(outputs, 'stage3.nodeVoltage'), 251);
  });

  it('RC attenuation: 1 kΩ, 47 µF at 100 Hz → 0.03384 (−29.41 dB) [derived, docs/references.md §3]', () => {
    expectClose(rcAttenuation(1000, 47e-6, 100), 0.03384);
    // 350 → 330 V at 20 mA is exactly 1 kΩ, an E12 value, so the reckoner uses 1 kΩ.
    const { outputs } = run('dropper-ladder', {
      startVoltage: 350,
      startRipple: '2 V',
      stages: [{ targetVoltage: 330, current: '20 mA', capacitance: '47 µF' }],
    });
    expectClose(num(outputs, 'stage1.attenuation'), 0.03384);
    expectClose(num(outputs, 'stage1.attenuationDb'), -29.41);
    expectClose(num(outputs, 'stage1.ripple'), 2 * 0.03384);
  });

  it('suggests the next common power rating at or above twice the dissipation [common practice, no source]', () => {
    expect(suggestedPowerRating(0.1)).toBe(0.25);
    expect(suggestedPowerRating(0.25)).toBe(0.5);
    expect(suggestedPowerRating(1.6)).toBe(5);
  });

  it('rejects a target that does not step down, naming the row', () => {
    const errs = fieldErrors('dropper-ladder', {
      startVoltage: 350,
      stages: [
        { targetVoltage: 300, current: 0.01, capacitance: '47u' },
        { targetVoltage: 320, current: 0.01, capacitance: '47u' },
      ],
    });
    expect(errs).toEqual([
      { field: 'stages.1.targetVoltage', reason: expect.stringMatching(/below the node before it/) },
    ]);
  });

  it('rejects a chain where no current flows through a resistor', () => {
    const errs = fieldErrors('dropper-ladder', {
      startVoltage: 350,
      stages: [{ targetVoltage: 300, current: 0, capacitance: '47u' }],
    });
    expect(errs[0]!.field).toBe('stages.0.current');
  });

  describe('fitted resistors', () => {
    // Two stages, 10 mA drawn at each node: 20 mA through R1, 10 mA through R2.
    const chain = (start: number, fitted: [string | undefined, string | undefined]) => ({
      startVoltage: start,
      stages: [
        {
          label: 'B+2',
          targetVoltage: 300,
          current: '10 mA',
          capacitance: '47u',
          fittedResistance: fitted[0],
        },
        {
          label: 'B+3',
          targetVoltage: 250,
          current: '10 mA',
          capacitance: '22u',
          fittedResistance: fitted[1],
        },
      ],
    });

    it('worked example: 350 V through fitted 2k2 then 5k6 → 306 V, 250 V; 0.88 W and 0.56 W [derived: R = ΔV / I, P = ΔV × I — docs/references.md §4]', () => {
      const { outputs } = run('dropper-ladder', chain(350, ['2k2', '5k6']));
      // Exact values for the targets, for comparison: 50 V / 20 mA = 2.5 kΩ; 50 V / 10 mA = 5 kΩ
      expectClose(num(outputs, 'stage1.resistanceExact'), 2500);
      expectClose(num(outputs, 'stage2.resistanceExact'), 5000);
      // The suggestions stay: nearest E12 to 2.5 kΩ is 2.7 kΩ, to 5 kΩ is 4.7 kΩ [IEC 60063 E12] — not the parts fitted.
      expect(num(outputs, 'stage1.resistanceE12')).toBe(2700);
      expect(num(outputs, 'stage2.resistanceE12')).toBe(4700);
      expect(num(outputs, 'stage1.resistance')).toBe(2200);
      expect(num(outputs, 'stage2.resistance')).toBe(5600);
      // ΔV1 = 2200 Ω × 20 mA = 44 V → 306 V; ΔV2 = 5600 Ω × 10 mA = 56 V → 250 V
      expectClose(num(outputs, 'stage1.nodeVoltage'), 306);
      expectClose(num(outputs, 'stage2.nodeVoltage'), 250);
      expectClose(num(outputs, 'finalVoltage'), 250);
      // P = ΔV × I: 44 V × 20 mA = 0.88 W; 56 V × 10 mA = 0.56 W
      expectClose(num(outputs, 'stage1.dissipation'), 0.88);
      expectClose(num(outputs, 'stage2.dissipation'), 0.56);
      expect(outputs['stage1.nodeVoltage']!.label).toMatch(/fitted/);
      expect(outputs['stage1.nodeVoltage']!.explanation).toMatch(/fitted 2\.2 kΩ/);
      expect(outputs.finalVoltage!.explanation).toBe('With the fitted resistors.');
    });

    it('at +10 % start (385 V) the nodes follow the fitted parts, while the E12 suggestion moves to 3k9 [derived, docs/references.md §4; IEC 60063 E12]', () => {
      const { outputs } = run('dropper-ladder', chain(385, ['2k2', '5k6']));
      // Exact for the target is now 85 V / 20 mA = 4.25 kΩ, nearest E12 3.9 kΩ — reported, not used.
      expectClose(num(outputs, 'stage1.resistanceExact'), 4250);
      expect(num(outputs, 'stage1.resistanceE12')).toBe(3900);
      // 385 − 44 = 341 V; 341 − 56 = 285 V (each node 35 V up, as the start)
      expectClose(num(outputs, 'stage1.nodeVoltage'), 341);
      expectClose(num(outputs, 'stage2.nodeVoltage'), 285);
      expectClose(num(outputs, 'stage1.dissipation'), 0.88);
    });

    it('without fitted values keeps choosing the E-series value at the given start: 385 V → 3k9, 385 − 78 = 307 V [derived; IEC 60063 E12; docs/references.md §4]', () => {
      const { outputs } = run('dropper-ladder', chain(385, [undefined, undefined]));
      expect(num(outputs, 'stage1.resistance')).toBe(3900);
      expectClose(num(outputs, 'stage1.nodeVoltage'), 307);
      // Stage 2: exact 5 kΩ → E12 4.7 kΩ, 47 V → 260 V
      expect(num(outputs, 'stage2.resistance')).toBe(4700);
      expectClose(num(outputs, 'stage2.nodeVoltage'), 260);
      expectClose(num(outputs, 'stage1.dissipation'), 0.02 * 0.02 * 3900);
      expect(outputs['stage1.nodeVoltage']!.label).toMatch(/E12 values/);
      expect(outputs.finalVoltage!.explanation).toBe('With E12 values.');
    });

    it('mixes fitted and chosen stages: the chosen stage still works from the targets, its node from the actual voltage [derived: R = ΔV / I; IEC 60063 E12; docs/references.md §4]', () => {
      const { outputs } = run('dropper-ladder', chain(385, ['2k2', undefined]));
      expectClose(num(outputs, 'stage1.nodeVoltage'), 341);
      // Stage 2 exact from the targets (300 → 250 V at 10 mA) = 5 kΩ → E12 4.7 kΩ; node 341 − 47 = 294 V
      expectClose(num(outputs, 'stage2.resistanceExact'), 5000);
      expect(num(outputs, 'stage2.resistance')).toBe(4700);
      expectClose(num(outputs, 'stage2.nodeVoltage'), 294);
      expect(outputs.finalVoltage!.explanation).toBe(
        'With the fitted resistors where given, E12 values elsewhere.',
      );
    });

    it('property: with fitted values, raising the start voltage by 10 % raises every node voltage (by exactly the rise of the start) [derived: R = ΔV / I, P = I² R; docs/references.md §4]', () => {
      fc.assert(
        fc.property(
          fc.double({ min: 50, max: 1000, noNaN: true }),
          fc.array(
            fc.record({
              frac: fc.double({ min: 0.8, max: 0.99, noNaN: true }),
              current: fc.double({ min: 1e-4, max: 0.05, noNaN: true }),
              misfit: fc.double({ min: 0.7, max: 1.3, noNaN: true }),
            }),
            { minLength: 1, maxLength: 5 },
          ),
          (start, rows) => {
            // Targets step down by 1–20 % a stage; fitted parts within ±30 % of the exact value,
            // so the whole fitted drop stays below 1.3 × 0.7 of the start and every node is positive.
            const targets: number[] = [];
            rows.reduce((v, r) => (targets.push(v * r.frac), v * r.frac), start);
            const through = rows.map((_, i) => rows.slice(i).reduce((a, r) => a + r.current, 0));
            const stages = rows.map((r, i) => ({
              targetVoltage: targets[i]!,
              current: r.current,
              capacitance: 47e-6,
              fittedResistance:
                (((i === 0 ? start : targets[i - 1]!) - targets[i]!) / through[i]!) * r.misfit,
            }));
            const base = run('dropper-ladder', { startVoltage: start, stages }).outputs;
            const high = run('dropper-ladder', { startVoltage: start * 1.1, stages }).outputs;
            stages.forEach((_, i) => {
              const b = num(base, `stage${i + 1}.nodeVoltage`);
              const h = num(high, `stage${i + 1}.nodeVoltage`);
              expect(b).toBeGreaterThan(0);
              expect(h).toBeGreaterThan(b);
              expectClose(h - b, start * 0.1, 1e-6);
              // Fixed node currents and fixed resistors: the dissipation stays I² R at either start voltage.
              const expected = through[i]! ** 2 * stages[i]!.fittedResistance;
              expectClose(num(base, `stage${i + 1}.dissipation`), expected, 1e-9);
              expectClose(num(high, `stage${i + 1}.dissipation`), expected, 1e-9);
            });
          },
        ),
        { numRuns: 300 },
      );
    });

    it('reports a node at or below zero as an error on the fitted value, never clamping', () => {
      // 350 V − 2k2 × 20 mA = 306 V; 306 V − 33k × 10 mA = −24 V
      const errs = fieldErrors('dropper-ladder', chain(350, ['2k2', '33k']));
      expect(errs).toEqual([
        {
          field: 'stages.1.fittedResistance',
          reason: expect.stringMatching(/fitted 33 kΩ carrying 10 mA, this node falls to -24 V from 306 V/),
        },
      ]);
    });

    it('reports a chain whose standard values drive a node to zero or below as an error on the target', () => {
      // 360 V → 1 mV at 10 mA: exact 36 kΩ, nearest E12 39 kΩ drops 390 V
      const errs = fieldErrors('dropper-ladder', {
        startVoltage: 360,
        stages: [{ targetVoltage: '1 mV', current: '10 mA', capacitance: '1u' }],
      });
      expect(errs.map((e) => e.field)).toEqual(['stages.0.targetVoltage']);
    });

    it('rejects a fitted value of zero or below, naming the row', () => {
      const errs = fieldErrors('dropper-ladder', chain(350, ['0', undefined]));
      expect(errs.map((e) => e.field)).toEqual(['stages.0.fittedResistance']);
    });
  });
});

describe('dropper ladder: LC sections and the ripple frequency', () => {
  const lcStage = {
    targetVoltage: 340,
    current: '50 mA',
    capacitance: '47 µF',
    element: 'choke',
    inductance: '10 H',
    fittedResistance: '150 Ω',
  };

  it('an LC section attenuates by |Z_C ÷ (Z_L + Z_C)| at twice the mains [complex impedances by mathjs; docs/references.md §3]', () => {
    const { outputs } = run('dropper-ladder', {
      startVoltage: 350,
      mainsFrequency: '50 Hz',
      stages: [lcStage],
    });
    const w = 2 * Math.PI * 100;
    const zl = complex(0, w * 10);
    const zc = complex(0, -1 / (w * 47e-6));
    const h = abs(divide(zc, add(zl, zc)) as Complex) as unknown as number;
    expectClose(num(outputs, 'stage1.attenuation'), h, 1e-9);
    expectClose(num(outputs, 'rippleFrequency'), 100, 1e-12);
    // The DC drop is the choke's resistance × the current: 350 − 0.05 × 150.
    expectClose(num(outputs, 'stage1.nodeVoltage'), 342.5, 1e-12);
    expect(outputs['stage1.resistanceE12']).toBeUndefined();
  });

  it('the ripple frequency follows the mains and the rectification, never a typed figure [derived]', () => {
    const stage = { targetVoltage: 330, current: '20 mA', capacitance: '47 µF' };
    const at60 = run('dropper-ladder', { startVoltage: 350, mainsFrequency: '60 Hz', stages: [stage] });
    expectClose(num(at60.outputs, 'stage1.attenuation'), rcAttenuation(1000, 47e-6, 120), 1e-12);
    const half = run('dropper-ladder', {
      startVoltage: 350,
      mainsFrequency: '60 Hz',
      rectification: 'half-wave',
      stages: [stage],
    });
    expectClose(num(half.outputs, 'stage1.attenuation'), rcAttenuation(1000, 47e-6, 60), 1e-12);
  });

  it('a block written with a typed ripple frequency evaluates as it did (approved revisions do not change)', () => {
    const stage = { targetVoltage: 330, current: '20 mA', capacitance: '47 µF' };
    const old = run('dropper-ladder', { startVoltage: 350, rippleFrequency: '120 Hz', stages: [stage] });
    expectClose(num(old.outputs, 'stage1.attenuation'), rcAttenuation(1000, 47e-6, 120), 1e-12);
  });

  it('warns when an LC resonance is near or above the ripple frequency [common practice, no source]', () => {
    const { cautions } = run('dropper-ladder', {
      startVoltage: 350,
      stages: [{ ...lcStage, inductance: '100 mH', capacitance: '10 µF' }],
    });
    const c = cautions.find((x) => x.code === 'resonance-near-ripple');
    expect(c?.field).toBe('stages.0.inductance');
    const fine = run('dropper-ladder', { startVoltage: 350, stages: [lcStage] });
    expect(fine.cautions.map((x) => x.code)).not.toContain('resonance-near-ripple');
  });

  it('a choke needs its inductance and its DC resistance', () => {
    const errors = fieldErrors('dropper-ladder', {
      startVoltage: 350,
      stages: [{ targetVoltage: 340, current: '50 mA', capacitance: '47 µF', element: 'choke' }],
    }).map((e) => e.field);
    expect(errors).toEqual(expect.arrayContaining(['stages.0.inductance', 'stages.0.fittedResistance']));
  });
});
