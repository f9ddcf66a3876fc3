import { describe, expect, it } from 'vitest';
import { getReckoner, listReckoners, RECKONER_KINDS, reckoners } from '../../../shared/reckoners/registry';
import { validateInputs } from '../../../shared/reckoners/validate';
import { WORKED_EXAMPLES } from './examples';

describe('registry', () => {
  it('holds the thirteen reckoners under their stable kind ids', () => {
    expect(RECKONER_KINDS).toEqual([
      'mains-fuse',
      'peak-no-load',
      'loaded-bplus',
      'dropper-ladder',
      'choke-input',
      'bleeder',
      'heater-budget',
      'reading-tolerance',
      'mains-conversion',
      'switch-on-surge',
      'transformer-loading',
      'rectifier-substitution',
      'part-ratings',
    ]);
    for (const kind of RECKONER_KINDS) {
      expect(getReckoner(kind)!.kind).toBe(kind);
      expect(reckoners[kind].kind).toBe(kind);
    }
    expect(listReckoners()).toHaveLength(13);
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
      if (f.default !== undefined && f.min !== undefined)
        expect(f.default as number).toBeGreaterThanOrEqual(f.min);
      if (f.default !== undefined && f.max !== undefined)
        expect(f.default as number).toBeLessThanOrEqual(f.max);
    }
  });

  it.each(RECKONER_KINDS)('%s: field keys are exactly the keys the schema reads', (kind) => {
    const def = getReckoner(kind)!;
    const declared = new Set(def.fields.map((f) => f.key));
    // Whatever an empty input lacks is a declared field (nothing needed is invisible in forms).
    const empty = validateInputs(kind, {});
    if (!empty.ok)
      for (const e of empty.errors)
        expect(declared.has(e.field.split('.')[0]!), `${kind}: ${e.field}`).toBe(true);
    // The worked example parses to declared keys only, and every field that is neither optional nor
    // defaulted is present.
    const example = validateInputs(kind, WORKED_EXAMPLES[kind]!.inputs);
    if (!example.ok) throw new Error(`${kind}: ${JSON.stringify(example.errors)}`);
    const parsed = Object.keys(example.input as object);
    for (const k of parsed) expect(declared.has(k), `${kind}: parsed key ${k}`).toBe(true);
    for (const f of def.fields) if (!f.optional) expect(parsed, `${kind}: ${f.key}`).toContain(f.key);
    // Every declared field is read: a value of the wrong type there is refused, naming that field.
    for (const f of def.fields) {
      const r = validateInputs(kind, { ...WORKED_EXAMPLES[kind]!.inputs, [f.key]: { wrong: true } });
      expect(r.ok, `${kind}: ${f.key} = { wrong: true }`).toBe(false);
      if (!r.ok)
        expect(
          r.errors.map((e) => e.field.split('.')[0]),
          `${kind}: ${f.key}`,
        ).toContain(f.key);
    }
    // A key no field declares is refused by name (a misspelt input is never dropped silently).
    const extra = validateInputs(kind, { ...WORKED_EXAMPLES[kind]!.inputs, notAField: 1 });
    expect(extra.ok).toBe(false);
    if (!extra.ok) expect(extra.errors.map((e) => e.field)).toEqual(['notAField']);
  });

  it('every reckoner defers to local codes and licensed practice, and never calls anything safe [docs/references.md §8]', () => {
    for (const def of listReckoners()) {
      const v = validateInputs(def.kind, WORKED_EXAMPLES[def.kind]?.inputs);
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
