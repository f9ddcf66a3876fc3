/**
 * A reading's expected band: its measure is checked against the reckoner output it refers to, a
 * typed value may follow the mains, a tolerance needs % or a unit, and a band never reaches past
 * zero. Winding scaling [derived: V_actual = V_rated × V_mains,actual ÷ V_mains,nominal;
 * docs/references.md §2]; IEC 60038 mains limits 230 V ± 10 % → 207–253 V [std, docs/references.md §2].
 */
import { describe, expect, it } from 'vitest';
import { evaluateDocument } from '../../../shared/document/evaluate';
import type { ProcedureDoc, ReadingAttrs } from '../../../shared/document/schema';
import { upgradeDocument } from '../../../shared/document/upgrade';
import { parseTolerance } from '../../../shared/reckoners/reading-tolerance';

const params = { mainsNominal: 230, mainsVoltage: 230, mainsFrequency: 50 };

function reading(attrs: Partial<ReadingAttrs>): ProcedureDoc['content'][number] {
  return {
    type: 'reading',
    attrs: {
      id: 'reading-1',
      label: 'Heater winding, unloaded',
      testPoint: 'pins 2–7',
      meterRange: 'AC 20 V',
      unit: 'V',
      expected: { literal: '6.9 V' },
      tolerance: '±0.4 V',
      ...attrs,
    },
  };
}

const peakBlock = (inputs: Record<string, unknown>) => ({
  type: 'reckoner',
  attrs: {
    id: 'block-peak',
    name: 'pk',
    kind: 'peak-no-load',
    inputs: { windingVoltage: '280 V', rectifier: 'silicon-bridge', ...inputs },
  },
});

const doc = (...content: ProcedureDoc['content']): ProcedureDoc => ({ type: 'doc', content });

describe('typed expected values and the mains', () => {
  it('a heater winding marked as following the mains expects 6.9 × 253/230 = 7.59 V at 253 V, so a healthy 7.5 V passes', () => {
    const s = evaluateDocument(doc(reading({ followsMains: true })), { ...params, mainsVoltage: 253 });
    const r = s.readings[0]!;
    expect(r.expected).toBeCloseTo(7.59, 6);
    expect(r.low! <= 7.5 && 7.5 <= r.high!).toBe(true);
  });

  it('a typed value stated fixed (or not stated) stays as typed', () => {
    for (const followsMains of [false, undefined]) {
      const s = evaluateDocument(doc(reading({ followsMains })), { ...params, mainsVoltage: 253 });
      expect(s.readings[0]!.expected).toBe(6.9);
    }
  });
});

describe('a block inserted with empty mains fields follows the bench mains', () => {
  it('236 V at the bench on a 230 V design moves the no-load DC with it [derived: √2 × 280 × 236/230 − 2 × 0.9]', () => {
    // The shape the editor used to insert: nominal typed, actual left empty.
    const d = doc(
      peakBlock({ mainsNominal: '230 V', mainsActual: '' }),
      reading({ meterRange: 'DC 1000 V', expected: { ref: 'pk.noLoadDc' }, tolerance: '±10 %' }),
    );
    const atDesign = evaluateDocument(d, params).readings[0]!.expected!;
    const atBench = evaluateDocument(d, { ...params, mainsVoltage: 236 }).readings[0]!.expected!;
    expect(atDesign).toBeCloseTo(Math.SQRT2 * 280 - 1.8, 6);
    expect(atBench).toBeCloseTo(Math.SQRT2 * 280 * (236 / 230) - 1.8, 6);
  });

  it('the load-time upgrade points empty followed fields at their parameter and gives readings a measure', () => {
    const up = upgradeDocument(doc(peakBlock({ mainsActual: '' }), reading({})));
    const inputs = (up.content[0]!.attrs as { inputs: Record<string, unknown> }).inputs;
    expect(inputs.mainsActual).toEqual({ param: 'mainsVoltage' });
    expect(inputs.mainsNominal).toEqual({ param: 'mainsNominal' });
    expect((up.content[1]!.attrs as ReadingAttrs).measure).toBe('rms');
  });
});

describe('measures between readings and outputs', () => {
  it('a DC reading cannot take its expected value from an rms output', () => {
    const s = evaluateDocument(
      doc(
        peakBlock({}),
        reading({
          meterRange: 'DC 1000 V',
          measure: 'dc',
          expected: { ref: 'pk.windingVoltage' },
          tolerance: '±5 %',
        }),
      ),
      params,
    );
    expect(s.readings[0]!.expected).toBeNull();
    expect(s.readings[0]!.error).toMatch(/V rms.*V DC/);
  });

  it('a typed "350 VAC" on a DC reading is refused', () => {
    const s = evaluateDocument(
      doc(
        reading({
          meterRange: 'DC 1000 V',
          measure: 'dc',
          expected: { literal: '350 VAC' },
          tolerance: '±5 %',
        }),
      ),
      params,
    );
    expect(s.readings[0]!.error).toMatch(/rms value/);
  });

  it('an expected value beyond any bench meter is a message, not an internal error', () => {
    const s = evaluateDocument(doc(reading({ expected: { literal: '1e308 V' } })), params);
    expect(s.readings[0]!.error).toMatch(/beyond what a bench meter reads/);
  });
});

describe('tolerances carry a unit or a percentage', () => {
  it.each(['±5', '5', '+10/-5', '± 0.4'])('"%s" is refused with a message asking for % or the unit', (t) => {
    expect(() => parseTolerance(t, 'V')).toThrow(/add % or V/);
  });

  it.each([
    ['±5 %', { kind: 'percent', percent: 5 }],
    ['±0.4 V', { kind: 'absolute', amount: 0.4 }],
    ['+10/-5 %', { kind: 'asymmetric', above: 10, below: 5, basis: 'percent' }],
  ])('"%s" is read', (t, expected) => {
    expect(parseTolerance(t, 'V')).toEqual(expected);
  });

  it('"±150 %" on a 350 V reading is refused: the band would reach −175 V', () => {
    const s = evaluateDocument(
      doc(reading({ meterRange: 'DC 1000 V', expected: { literal: '350 V' }, tolerance: '±150 %' })),
      params,
    );
    expect(s.readings[0]!.bandText).toBeNull();
    expect(s.readings[0]!.error).toMatch(/past zero/);
  });

  it('"±5" on a 6.3 V reading no longer becomes ±5 V (which would pass 11 V)', () => {
    const s = evaluateDocument(doc(reading({ expected: { literal: '6.3 V' }, tolerance: '±5' })), params);
    expect(s.readings[0]!.high).toBeNull();
    expect(s.readings[0]!.error).toMatch(/add % or V/);
  });
});
