import { describe, expect, it } from 'vitest';
import { divide, multiply, unit, type Unit } from 'mathjs';
import { IEC_60127_RATED_CURRENTS } from '../../../shared/standards/fuses';
import { expectClose, num, run } from '../helpers';

const dualPrimary = [
  { label: 'Halves in parallel', volts: '120 V' },
  { label: 'Halves in series', volts: '240 V' },
];
const northAmericanUnit = {
  fromVoltage: '120 V',
  fromFrequency: '60 Hz',
  toVoltage: '230 V',
  toFrequency: '50 Hz',
  connections: dualPrimary,
  fuseRating: '2 A',
};

/**
 * Peak flux density from the transformer EMF equation, B = E / (4.44 f N A) [Fink & Beaty, *Standard
 * Handbook for Electrical Engineers*, transformer section, from memory; docs/references.md §10],
 * worked in mathjs units for one winding (N turns, core area A) so the test does not share the
 * reckoner's ratio arithmetic.
 */
function peakFluxDensity(volts: number, hz: number, turns = 500, areaCm2 = 10): number {
  const denominator = multiply(multiply(unit(4.44 * hz, 'Hz'), turns), unit(areaCm2, 'cm^2')) as Unit;
  return (divide(unit(volts, 'V'), denominator) as Unit).toNumber('T');
}

describe('mains conversion', () => {
  it('a 60 Hz transformer on 50 Hz at its rated voltage carries 20 % more flux [transformer EMF equation, docs/references.md §10]', () => {
    const { outputs, cautions } = run('mains-conversion', {
      ...northAmericanUnit,
      toVoltage: '240 V',
    });
    const expected = peakFluxDensity(240, 50) / peakFluxDensity(240, 60) - 1;
    expectClose(num(outputs, 'fluxChange') / 100, expected, 1e-9);
    expectClose(num(outputs, 'fluxChange'), 20, 1e-9);
    expect(cautions.map((c) => c.code)).toContain('flux-rise');
  });

  it('picks the series connection for 230 V and scales the secondaries by 230/240 [derived]', () => {
    const { outputs } = run('mains-conversion', { ...northAmericanUnit, secondaryVoltage: '300 V' });
    expect(outputs.connection!.value).toContain('Halves in series');
    expectClose(num(outputs, 'secondaryRatio'), (100 * 230) / 240, 1e-9);
    expectClose(num(outputs, 'secondaryAfter'), (300 * 230) / 240, 1e-9);
    // Lower voltage partly offsets the lower frequency: (230/240) × (60/50) − 1 = 15 %.
    expectClose(
      num(outputs, 'fluxChange') / 100,
      peakFluxDensity(230, 50) / peakFluxDensity(240, 60) - 1,
      1e-9,
    );
  });

  it('the nearest connection is chosen by ratio, not by difference in volts [derived]', () => {
    const taps = [{ volts: '100 V' }, { volts: '120 V' }, { volts: '220 V' }, { volts: '240 V' }];
    // 230/220 = 1.045, 240/230 = 1.043: 240 V is the nearer by ratio although both are 10 V away.
    const { outputs } = run('mains-conversion', { ...northAmericanUnit, connections: taps });
    expect(outputs.connection!.value).toBe('240 V');
    const to110 = run('mains-conversion', {
      ...northAmericanUnit,
      fromVoltage: '230 V',
      fromFrequency: '50 Hz',
      toVoltage: '110 V',
      toFrequency: '60 Hz',
      connections: taps,
    });
    expect(to110.outputs.connection!.value).toBe('120 V');
  });

  it('the fuse scales inversely with the mains and rounds up to an IEC 60127-2 rating [same power: I ∝ 1/V, docs/references.md §1]', () => {
    const { outputs } = run('mains-conversion', northAmericanUnit);
    const exact = (unit(2, 'A').toNumber('A') * 120) / 230;
    expectClose(num(outputs, 'fuseExact'), exact, 1e-12);
    const next = IEC_60127_RATED_CURRENTS.filter((r) => r >= exact).sort((a, b) => a - b)[0]!;
    expect(num(outputs, 'newFuse')).toBe(next);
    expect(next).toBe(1.25);
  });

  it('going to a higher frequency lowers the flux and raises no flux caution; ripple falls [derived]', () => {
    const { outputs, cautions } = run('mains-conversion', {
      fromVoltage: '230 V',
      fromFrequency: '50 Hz',
      toVoltage: '120 V',
      toFrequency: '60 Hz',
      connections: [{ volts: '115 V' }, { volts: '230 V' }],
      fuseRating: '500 mA',
    });
    expect(num(outputs, 'fluxChange')).toBeLessThan(0);
    expect(cautions.map((c) => c.code)).not.toContain('flux-rise');
    expectClose(num(outputs, 'rippleChange'), 100 * (50 / 60 - 1), 1e-9);
    expectClose(num(outputs, 'rippleFrequency'), 120, 1e-12);
  });

  it('says when no connection suits the new mains and when secondaries run high', () => {
    const none = run('mains-conversion', { ...northAmericanUnit, connections: [{ volts: '120 V' }] });
    const codes = none.cautions.map((c) => c.code);
    expect(codes).toContain('no-suitable-connection');
    expect(codes).toContain('secondaries-high');
    expect(none.cautions.find((c) => c.code === 'mains-wiring')?.level).toBe('danger');
  });
});
