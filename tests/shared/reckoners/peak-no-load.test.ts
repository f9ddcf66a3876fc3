import { describe, expect, it } from 'vitest';
import { divide, dotPow, mean, range, sqrt, unit, type Matrix, type Unit } from 'mathjs';
import { expectClose, fieldErrors, num, run } from '../helpers';

describe('peak-no-load', () => {
  it('peak = √2 × Vrms: 120 V → 169.71 V, 230 V → 325.27 V [derived, docs/references.md §2]', () => {
    expectClose(num(run('peak-no-load', { windingVoltage: '120 V' }).outputs, 'peakVoltage'), 169.71);
    expectClose(num(run('peak-no-load', { windingVoltage: '230 VAC' }).outputs, 'peakVoltage'), 325.27);
  });

  it('peak from the definition of rms: the rms of a sampled unit sine, by mathjs, gives V_pk = V_rms ÷ rms(sin) [std: IEC 60050-103 rms value; docs/references.md §2, §7]', () => {
    // Uniform samples over whole periods: mean(sin²) is exactly ½ in exact arithmetic, so this is an
    // independent route to √2 — no √2 is written here.
    const samples = range(0, 3600).map((k: number) => Math.sin((2 * Math.PI * k) / 3600));
    const rmsOfUnitSine = sqrt(mean(dotPow(samples, 2) as Matrix) as number) as number;
    for (const v of [6.3, 120, 230, 300]) {
      const peak = divide(unit(v, 'V'), rmsOfUnitSine) as Unit;
      expectClose(
        num(run('peak-no-load', { windingVoltage: v }).outputs, 'peakVoltage'),
        peak.toNumber('V'),
        1e-9,
      );
    }
  });

  it('no-load DC = peak − n × V_F: bridge n = 2, centre-tap n = 1 [common practice, docs/references.md §2]', () => {
    const pk = Math.SQRT2 * 300;
    expectClose(
      num(
        run('peak-no-load', { windingVoltage: 300, rectifier: 'silicon-bridge', diodeDrop: 1 }).outputs,
        'noLoadDc',
      ),
      pk - 2,
    );
    expectClose(
      num(
        run('peak-no-load', { windingVoltage: 300, rectifier: 'silicon-centre-tap', diodeDrop: 0.7 }).outputs,
        'noLoadDc',
      ),
      pk - 0.7,
    );
    expectClose(
      num(
        run('peak-no-load', { windingVoltage: 300, rectifier: 'valve', valveDrop: '25 V' }).outputs,
        'noLoadDc',
      ),
      pk - 25,
    );
  });

  it('scales a rated winding with the mains: V × actual ÷ nominal [derived, docs/references.md §2]', () => {
    const { outputs } = run('peak-no-load', { windingVoltage: 300, mainsNominal: 230, mainsActual: 253 });
    expectClose(num(outputs, 'windingVoltage'), 330); // 300 × 253/230, IEC 60038 upper limit [std]
    expectClose(num(outputs, 'peakVoltage'), Math.SQRT2 * 330);
  });

  it('does not scale a measured winding [derived: a measured figure is already at the actual mains; docs/references.md §2]', () => {
    const { outputs } = run('peak-no-load', {
      windingVoltage: 300,
      windingBasis: 'measured',
      mainsNominal: 230,
      mainsActual: 253,
    });
    expectClose(num(outputs, 'windingVoltage'), 300);
    expectClose(num(outputs, 'windingUnloadedHigh'), 300);
  });

  it('gives an unloaded band from rating to rating + 10 % [common practice, docs/references.md §2: 5–10 % on small transformers]', () => {
    const { outputs } = run('peak-no-load', { windingVoltage: 6.3 });
    expectClose(num(outputs, 'windingUnloadedLow'), 6.3);
    expectClose(num(outputs, 'windingUnloadedHigh'), 6.93);
    expectClose(num(outputs, 'noLoadDcHigh'), Math.SQRT2 * 6.93 - 1.8);
  });

  it('warns of the hazardous node and capacitor rating above 60 V [std: IEC 62368-1 ES1, from memory; docs/references.md §8]', () => {
    const { cautions } = run('peak-no-load', { windingVoltage: 300, filterNodes: 3 });
    expect(cautions.map((c) => c.code)).toEqual(
      expect.arrayContaining(['hazardous-voltage', 'capacitor-rating', 'local-codes']),
    );
    expect(cautions.find((c) => c.code === 'hazardous-voltage')!.message).toMatch(/3 filter nodes/);
    const low = run('peak-no-load', { windingVoltage: 6.3 });
    expect(low.cautions.some((c) => c.code === 'hazardous-voltage')).toBe(false);
  });

  it('requires the drop figure for a valve rectifier [docs/references.md §2: the author’s figure, no data sheet]', () => {
    expect(fieldErrors('peak-no-load', { windingVoltage: 300, rectifier: 'valve' })).toEqual([
      { field: 'valveDrop', reason: 'is required for a valve rectifier' },
    ]);
  });
});
