import { describe, expect, it } from 'vitest';
import { expectClose, num, run } from '../helpers';

describe('heater-budget', () => {
  it('parallel heaters: I = Σ I_h × count, VA = V × I [derived, docs/references.md §6]', () => {
    const { outputs, cautions } = run('heater-budget', {
      windingVoltage: '6.3 V',
      windingCurrent: '3 A',
      heaters: [
        { label: 'small-signal', volts: 6.3, amps: '300 mA', count: 4 },
        { label: 'output', volts: 6.3, amps: 0.9 },
      ],
    });
    expectClose(num(outputs, 'totalCurrent'), 2.1);
    expectClose(num(outputs, 'windingVA'), 6.3 * 2.1);
    expectClose(num(outputs, 'percentOfRating'), 70);
    expect(cautions.some((c) => c.code === 'heater-overload' || c.code === 'heater-near-limit')).toBe(false);
  });

  it('warns above 100 % and notes near the limit: 4 × 0.8 A on 3 A = 106.7 % [derived: heater current ÷ winding rating, docs/references.md §6; the near-limit level is the author’s input]', () => {
    const over = run('heater-budget', { windingCurrent: 3, heaters: [{ volts: 6.3, amps: 0.8, count: 4 }] });
    expectClose(num(over.outputs, 'percentOfRating'), 320 / 3);
    expect(over.cautions.find((c) => c.code === 'heater-overload')?.level).toBe('warning');
    const near = run('heater-budget', { windingCurrent: 3, heaters: [{ volts: 6.3, amps: 0.7, count: 4 }] });
    expect(near.cautions.find((c) => c.code === 'heater-near-limit')?.level).toBe('note');
  });

  it('series string: V = Σ V_h at one current, dropper R = (V_s − ΣV_h) / I [derived, docs/references.md §6]', () => {
    const { outputs } = run('heater-budget', {
      arrangement: 'series',
      windingVoltage: 100,
      windingCurrent: 0.3,
      heaters: [
        { volts: 12.6, amps: 0.15, count: 3 },
        { volts: 35, amps: 0.15 },
      ],
    });
    expectClose(num(outputs, 'stringVoltage'), 72.8);
    expectClose(num(outputs, 'totalCurrent'), 0.15);
    expectClose(num(outputs, 'dropperResistance'), 27.2 / 0.15);
    expectClose(num(outputs, 'dropperDissipation'), 0.15 * 27.2);
  });

  it('flags a heater more than 10 % off the winding [from memory: amateur radio handbooks, ± 10 %; docs/references.md §6]', () => {
    const { cautions } = run('heater-budget', { windingCurrent: 3, heaters: [{ volts: 12.6, amps: 0.15 }] });
    expect(cautions.some((c) => c.code === 'heater-voltage')).toBe(true);
  });

  it('flags mismatched currents in a series string [derived: a series string runs at one current, docs/references.md §6]', () => {
    const { cautions } = run('heater-budget', {
      arrangement: 'series',
      windingVoltage: 120,
      windingCurrent: 1,
      heaters: [
        { volts: 12.6, amps: 0.15 },
        { volts: 6.3, amps: 0.3 },
      ],
    });
    expect(cautions.some((c) => c.code === 'series-mismatch')).toBe(true);
  });
});
