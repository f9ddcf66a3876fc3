import { describe, expect, it } from 'vitest';
import { expectClose, fieldErrors, num, run } from '../helpers';

/**
 * The largest reverse voltage across a non-conducting diode, found by sampling one mains cycle with the
 * reservoir held at the peak (no load) — the circuit's own voltages, not the 2√2 / √2 rule
 * [derived; docs/references.md §2].
 */
function sampledPiv(circuit: 'centre-tap' | 'bridge', vRms: number): number {
  const vPk = Math.SQRT2 * vRms;
  let worst = 0;
  for (let k = 0; k < 3600; k++) {
    const e = vPk * Math.sin((2 * Math.PI * k) / 3600);
    if (circuit === 'centre-tap') {
      // Each half-winding end against the centre tap (0 V); the cathodes sit at +V_pk.
      worst = Math.max(worst, vPk - e, vPk + e);
    } else {
      // Bridge: winding ends at ±e/2 about a floating centre; output rails +V_pk/2 and −V_pk/2.
      worst = Math.max(worst, vPk / 2 - e / 2, vPk / 2 + e / 2);
    }
  }
  return worst;
}

const valveToSilicon = {
  windingVoltage: '350 V',
  fromValveDrop: '50 V',
  diodeDrop: '1 V',
  loadCurrent: '150 mA',
  highMains: '10 %',
};

describe('rectifier substitution', () => {
  it('each node rises by the difference in drop, and a series resistor of ΔV ÷ I restores it [derived]', () => {
    const { outputs } = run('rectifier-substitution', {
      ...valveToSilicon,
      nodes: [{ label: 'B+1', volts: '400 V' }, { volts: '350 V' }],
    });
    expectClose(num(outputs, 'bplusChange'), 49, 1e-12);
    expectClose(num(outputs, 'node1.voltage'), 449, 1e-12);
    expectClose(num(outputs, 'node2.voltage'), 399, 1e-12);
    expectClose(num(outputs, 'seriesResistanceExact'), 49 / 0.15, 1e-12);
    expect(num(outputs, 'seriesResistance')).toBe(330);
    expectClose(num(outputs, 'seriesDissipation'), 0.15 * 0.15 * 330, 1e-12);
  });

  it('peak inverse voltage at high mains matches the sampled circuit for a centre tap and a bridge', () => {
    const ct = run('rectifier-substitution', valveToSilicon);
    expectClose(num(ct.outputs, 'diodePiv'), sampledPiv('centre-tap', 350 * 1.1), 1e-6);
    const bridge = run('rectifier-substitution', { ...valveToSilicon, circuit: 'bridge' });
    expectClose(num(bridge.outputs, 'diodePiv'), sampledPiv('bridge', 350 * 1.1), 1e-6);
  });

  it('flags diodes rated too close to the peak inverse voltage [1.2× margin: common practice, no source]', () => {
    const { cautions } = run('rectifier-substitution', { ...valveToSilicon, diodePiv: '1000 V' });
    // 2√2 × 385 V = 1089 V in reverse: a 1000 V diode is below it.
    expect(cautions.find((c) => c.code === 'diode-piv')?.field).toBe('diodePiv');
    const ok = run('rectifier-substitution', { ...valveToSilicon, diodePiv: '1600 V' });
    expect(ok.cautions.map((c) => c.code)).not.toContain('diode-piv');
  });

  it('silicon leaves the filter at the no-load peak for the whole warm-up; a valve rectifier shortens it', () => {
    const silicon = run('rectifier-substitution', { ...valveToSilicon, outputWarmUp: '30 s' });
    expectClose(num(silicon.outputs, 'timeAtNoLoad'), 30, 1e-12);
    expect(silicon.cautions.map((c) => c.code)).toContain('no-load-soak');
    const valve = run('rectifier-substitution', {
      ...valveToSilicon,
      from: 'silicon',
      to: 'valve',
      toValveDrop: '20 V',
      outputWarmUp: '30 s',
      rectifierWarmUp: '12 s',
    });
    expectClose(num(valve.outputs, 'timeAtNoLoad'), 18, 1e-12);
    expectClose(num(valve.outputs, 'bplusChange'), 1 - 20, 1e-12);
    expect(valve.outputs.seriesResistance).toBeUndefined();
  });

  it('needs the valve drop for a valve on either side', () => {
    expect(
      fieldErrors('rectifier-substitution', { windingVoltage: '350 V', loadCurrent: '0.1 A' }).map(
        (e) => e.field,
      ),
    ).toContain('fromValveDrop');
  });
});
