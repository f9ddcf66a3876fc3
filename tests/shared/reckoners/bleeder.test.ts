import { describe, expect, it } from 'vitest';
import { evaluate } from 'mathjs';
import { expectClose, num, run } from '../helpers';

describe('bleeder', () => {
  it('100 µF at 450 V stores 10.13 J [derived, docs/references.md §5; cross-check with mathjs]', () => {
    const { outputs } = run('bleeder', { capacitance: '100u', chargedVoltage: '450 V' });
    expectClose(num(outputs, 'storedEnergy'), 10.13, 1e-3);
    expectClose(num(outputs, 'storedEnergy'), evaluate('0.5 * 100 uF * (450 V)^2').toNumber('J'), 1e-12);
    expectClose(num(outputs, 'storedCharge'), evaluate('100 uF * 450 V').toNumber('C'), 1e-12);
  });

  it('450 V → 60 V in 5 s with 100 µF needs R ≤ 24.82 kΩ [derived, docs/references.md §5; threshold std: IEC 60204-1 6.2.4]', () => {
    const { outputs } = run('bleeder', { capacitance: '100u', chargedVoltage: 450 });
    expectClose(num(outputs, 'maxBleeder'), 24820, 1e-3);
    expectClose(num(outputs, 'maxBleeder'), evaluate('5 s / (100 uF * log(450 / 60))').toNumber('ohm'), 1e-9);
    expect(num(outputs, 'suggestedBleeder')).toBe(22000); // E12 at or below [std: IEC 60063]
  });

  it('time constant and time to threshold: t = RC ln(V0/Vt) [derived; cross-check with mathjs]', () => {
    const { outputs, cautions } = run('bleeder', { capacitance: '100 µF', chargedVoltage: 450, bleederResistance: '22k' });
    expectClose(num(outputs, 'timeConstant'), evaluate('22 kohm * 100 uF').toNumber('s'), 1e-12);
    const t = evaluate('22 kohm * 100 uF * log(450 / 60)').toNumber('s');
    expectClose(num(outputs, 'timeToThreshold'), t, 1e-12);
    expect(t).toBeLessThan(5);
    expectClose(num(outputs, 'bleederDissipation'), (450 * 450) / 22000);
    expect(cautions.some((c) => c.code === 'slow-discharge')).toBe(false);
    expect(cautions.some((c) => c.code === 'verify-discharge')).toBe(true);
  });

  it('flags a bleeder that is too slow for the target time', () => {
    const { cautions } = run('bleeder', { capacitance: '100 µF', chargedVoltage: 450, bleederResistance: '220k' });
    expect(cautions.find((c) => c.code === 'slow-discharge')?.source).toMatch(/IEC 60204-1/);
  });

  it('uses the threshold the author sets (50 V: NFPA 70E / OSHA 1910.333 [std])', () => {
    const at60 = num(run('bleeder', { capacitance: '100u', chargedVoltage: 450, bleederResistance: '22k' }).outputs, 'timeToThreshold');
    const at50 = num(run('bleeder', { capacitance: '100u', chargedVoltage: 450, bleederResistance: '22k', threshold: '50 V' }).outputs, 'timeToThreshold');
    expectClose(at50 - at60, 2.2 * Math.log(60 / 50), 1e-9);
  });

  it('needs no bleeder when already at or below the threshold', () => {
    const { outputs } = run('bleeder', { capacitance: '100u', chargedVoltage: 50, bleederResistance: '100k' });
    expect(num(outputs, 'timeToThreshold')).toBe(0);
    expect(typeof outputs.suggestedBleeder!.value).toBe('string');
  });

  it('warns above the 45 µC charge limit [std: IEC 61010-1, partly from memory]', () => {
    expect(run('bleeder', { capacitance: '1u', chargedVoltage: 100 }).cautions.some((c) => c.code === 'stored-charge-limit')).toBe(true);
    expect(run('bleeder', { capacitance: '100n', chargedVoltage: 100 }).cautions.some((c) => c.code === 'stored-charge-limit')).toBe(false);
  });
});
