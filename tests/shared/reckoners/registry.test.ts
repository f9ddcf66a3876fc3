import { describe, expect, it } from 'vitest';
import { getReckoner, listReckoners, RECKONER_KINDS, reckoners } from '../../../shared/reckoners/registry';
import { validateInputs } from '../../../shared/reckoners/validate';

describe('registry', () => {
  it('holds the seven reckoners under their stable kind ids', () => {
    expect(RECKONER_KINDS).toEqual(['mains-fuse', 'peak-no-load', 'loaded-bplus', 'dropper-ladder', 'bleeder', 'heater-budget', 'reading-tolerance']);
    for (const kind of RECKONER_KINDS) {
      expect(getReckoner(kind)!.kind).toBe(kind);
      expect(reckoners[kind].kind).toBe(kind);
    }
    expect(listReckoners()).toHaveLength(7);
    expect(getReckoner('nope')).toBeUndefined();
    expect(getReckoner('toString')).toBeUndefined();
  });

  it.each(RECKONER_KINDS)('%s describes every input once, with a label', (kind) => {
    const def = getReckoner(kind)!;
    expect(def.label.length).toBeGreaterThan(3);
    expect(def.summary.length).toBeGreaterThan(10);
    const keys = def.fields.map((f) => f.key);
    expect(new Set(keys).size).toBe(keys.length);
    for (const f of def.fields) {
      expect(f.label.length).toBeGreaterThan(1);
      if (f.kind === 'select') expect(f.options?.length).toBeGreaterThan(0);
      if (f.kind === 'rows') expect(f.columns?.length).toBeGreaterThan(0);
      if (f.default !== undefined && f.min !== undefined) expect(f.default as number).toBeGreaterThanOrEqual(f.min);
      if (f.default !== undefined && f.max !== undefined) expect(f.default as number).toBeLessThanOrEqual(f.max);
    }
  });

  it('field keys are exactly the keys the schema reads (an unknown key is not silently needed)', () => {
    // A field missing from `fields` would be invisible in forms: check that supplying only the
    // declared fields with their defaults gives errors only for fields with no default.
    for (const def of listReckoners()) {
      const r = validateInputs(def.kind, {});
      if (r.ok) continue;
      const declared = new Set(def.fields.map((f) => f.key));
      for (const e of r.errors) expect(declared.has(e.field.split('.')[0]!), `${def.kind}: ${e.field}`).toBe(true);
    }
  });

  it('every reckoner defers to local codes and licensed practice', () => {
    const samples: Record<string, unknown> = {
      'mains-fuse': { load: 'va', va: 50 },
      'peak-no-load': { windingVoltage: 300 },
      'loaded-bplus': { windingVoltage: 300, sourceResistance: 80, reservoir: 47e-6, loadCurrent: 0.08 },
      'dropper-ladder': { startVoltage: 350, stages: [{ targetVoltage: 300, current: 0.02, capacitance: 47e-6 }] },
      bleeder: { capacitance: 1e-4, chargedVoltage: 450 },
      'heater-budget': { windingCurrent: 3, heaters: [{ volts: 6.3, amps: 0.3 }] },
      'reading-tolerance': { expected: 300, tolerance: '±5 %' },
    };
    for (const def of listReckoners()) {
      const v = validateInputs(def.kind, samples[def.kind]);
      if (!v.ok) throw new Error(`${def.kind}: ${JSON.stringify(v.errors)}`);
      const result = def.compute(v.input);
      const cautions = def.cautions(v.input, result);
      expect(cautions.some((c) => /local electrical codes and licensed practice/.test(c.message))).toBe(true);
      for (const c of cautions) expect(c.message).not.toMatch(/\bis safe\b/i);
      for (const o of Object.values(result.outputs)) {
        if (typeof o.value === 'number' && o.unit) expect(o.formatted.endsWith(o.unit)).toBe(true);
      }
    }
  });
});
