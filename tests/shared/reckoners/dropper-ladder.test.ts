import { describe, expect, it } from 'vitest';
import { rcAttenuation, suggestedPowerRating } from '../../../shared/reckoners/dropper-ladder';
import { expectClose, fieldErrors, num, run } from '../helpers';

describe('dropper-ladder', () => {
  it('350 V → 300 V at 20 mA: 2.5 kΩ, 1.0 W; E12 2.7 kΩ drops 54 V at 1.08 W [derived, REFERENCES §4]', () => {
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

  it('each resistor carries its node’s current and every later node’s [derived]', () => {
    const { outputs } = run('dropper-ladder', {
      startVoltage: 400,
      series: 'E24',
      stages: [
        { targetVoltage: 350, current: '10 mA', capacitance: '47u' },
        { targetVoltage: 300, current: '5 mA', capacitance: '22u' },
        { targetVoltage: 250, current: '5 mA', capacitance: '22u' },
      ],
    });
    expectClose(num(outputs, 'stage1.current'), 0.02);
    expectClose(num(outputs, 'stage2.current'), 0.01);
    expectClose(num(outputs, 'stage3.current'), 0.005);
    expectClose(num(outputs, 'stage1.resistanceExact'), 2500);
    expectClose(num(outputs, 'stage2.resistanceExact'), 5000);
    expectClose(num(outputs, 'stage3.resistanceExact'), 10000);
    // Node voltages recomputed with the E24 values, cumulatively [derived]
    const r1 = num(outputs, 'stage1.resistanceE24');
    const r2 = num(outputs, 'stage2.resistanceE24');
    const r3 = num(outputs, 'stage3.resistanceE24');
    expectClose(num(outputs, 'stage3.nodeVoltage'), 400 - r1 * 0.02 - r2 * 0.01 - r3 * 0.005, 1e-9);
  });

  it('RC attenuation: 1 kΩ, 47 µF at 100 Hz → 0.03384 (−29.41 dB) [derived, REFERENCES §3]', () => {
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
    expect(errs).toEqual([{ field: 'stages.1.targetVoltage', reason: expect.stringMatching(/below the node before it/) }]);
  });

  it('rejects a chain where no current flows through a resistor', () => {
    const errs = fieldErrors('dropper-ladder', { startVoltage: 350, stages: [{ targetVoltage: 300, current: 0, capacitance: '47u' }] });
    expect(errs[0]!.field).toBe('stages.0.current');
  });
});
