/**
 * The demo procedures in content-seed/procedures: each file must be a document the server would
 * accept as it stands — valid against the node schema, every reckoner evaluating, every reading
 * resolving to a band, and no warnings from the procedure check — and its mains-voltage inputs
 * must be wired to the procedure parameter, so a bench run at the measured mains moves the
 * expected values.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { evaluateDocument, type Snapshot } from '../../shared/document/evaluate';
import { extractBlocks, plainText } from '../../shared/document/extract';
import { lintProcedure } from '../../shared/document/lint';
import { paramsSchema, type ProcedureParams } from '../../shared/document/params';
import { validateDocument, walk, type ProcedureDoc } from '../../shared/document/schema';

const DIR = fileURLToPath(new URL('../../content-seed/procedures/', import.meta.url));
const PEOPLE = fileURLToPath(new URL('../../content-seed/people.json', import.meta.url));

interface SeedProcedure {
  seedKey: string;
  title: string;
  equipmentFamily: string;
  equipmentModel: string;
  tags: string[];
  author: string;
  reviewer: string;
  params: ProcedureParams;
  document: ProcedureDoc;
}

const files = readdirSync(DIR)
  .filter((f) => f.endsWith('.json'))
  .sort();

function load(file: string): SeedProcedure {
  return JSON.parse(readFileSync(join(DIR, file), 'utf8')) as SeedProcedure;
}

/** A fresh, validated copy of the document (validateDocument normalises attrs in place). */
function validDoc(seed: SeedProcedure): ProcedureDoc {
  const v = validateDocument(structuredClone(seed.document));
  if (!v.ok) throw new Error(`${seed.seedKey}: ${JSON.stringify(v.problems, null, 1)}`);
  return v.doc;
}

function expectCleanSnapshot(seedKey: string, snap: Snapshot) {
  for (const b of snap.blocks) {
    expect(b.ok, `${seedKey}: reckoner "${b.name}" ${b.ok ? '' : JSON.stringify(b.errors)}`).toBe(true);
  }
  expect(snap.errors, `${seedKey}: procedure errors`).toEqual([]);
  for (const r of snap.readings) {
    expect(r.error, `${seedKey}: reading ${r.id} (${r.label})`).toBeUndefined();
    expect(r.expected, `${seedKey}: reading ${r.id} expected`).not.toBeNull();
    expect(r.low, `${seedKey}: reading ${r.id} low`).not.toBeNull();
    expect(r.high, `${seedKey}: reading ${r.id} high`).not.toBeNull();
    expect(r.bandText, `${seedKey}: reading ${r.id} band`).toBeTruthy();
    expect(r.low!).toBeLessThanOrEqual(r.high!);
  }
}

/** Does an input value hold a { param: key } anywhere (rows included)? */
function usesParam(value: unknown, key: string): boolean {
  if (Array.isArray(value)) return value.some((v) => usesParam(v, key));
  if (value && typeof value === 'object') {
    const o = value as Record<string, unknown>;
    if (Object.keys(o).length === 1 && o.param === key) return true;
    return Object.values(o).some((v) => usesParam(v, key));
  }
  return false;
}

function refsOf(value: unknown, out: string[] = []): string[] {
  if (Array.isArray(value)) value.forEach((v) => refsOf(v, out));
  else if (value && typeof value === 'object') {
    const o = value as Record<string, unknown>;
    if (Object.keys(o).length === 1 && typeof o.ref === 'string') out.push(o.ref.slice(0, o.ref.indexOf('.')));
    else Object.values(o).forEach((v) => refsOf(v, out));
  }
  return out;
}

/** Names of reckoners whose result depends on the measured mains, directly or through references. */
function mainsDependent(doc: ProcedureDoc): Set<string> {
  const { reckoners } = extractBlocks(doc);
  const dependent = new Set(reckoners.filter((r) => usesParam(r.inputs, 'mainsVoltage')).map((r) => r.name));
  for (let changed = true; changed; ) {
    changed = false;
    for (const r of reckoners) {
      if (!dependent.has(r.name) && refsOf(r.inputs).some((n) => dependent.has(n))) {
        dependent.add(r.name);
        changed = true;
      }
    }
  }
  return dependent;
}

const people = (JSON.parse(readFileSync(PEOPLE, 'utf8')) as { people: { email: string; roles: string[] }[] }).people;
const rolesOf = (email: string) => people.find((p) => p.email === email)?.roles ?? [];

describe('content-seed procedures', () => {
  it('has at least four procedure files', () => {
    expect(files.length).toBeGreaterThanOrEqual(4);
  });

  it('seed keys are unique and match their file names', () => {
    const keys = files.map((f) => load(f).seedKey);
    expect(new Set(keys).size).toBe(keys.length);
    files.forEach((f, i) => expect(f).toBe(`${keys[i]}.json`));
  });

  describe.each(files)('%s', (file) => {
    const seed = load(file);

    it('has the fields the seed loader reads', () => {
      expect(seed.seedKey).toMatch(/^[a-z0-9][a-z0-9-]{2,60}$/);
      expect(seed.title.trim().length).toBeGreaterThan(5);
      expect(['Guitar amplifier', 'Hi-fi amplifier', 'Table radio']).toContain(seed.equipmentFamily);
      expect(['TC-18', 'TC-30H', 'TC-5R']).toContain(seed.equipmentModel);
      expect(Array.isArray(seed.tags) && seed.tags.length > 0).toBe(true);
      for (const t of seed.tags) expect(typeof t === 'string' && t.trim().length > 0).toBe(true);
      expect(paramsSchema.safeParse(seed.params).success).toBe(true);
    });

    it('is written by an author and reviewed by a different reviewer', () => {
      expect(seed.author).not.toBe(seed.reviewer);
      expect(rolesOf(seed.author)).toContain('author');
      expect(rolesOf(seed.reviewer)).toContain('reviewer');
    });

    it('passes validateDocument exactly', () => {
      const v = validateDocument(structuredClone(seed.document));
      expect(v.ok ? [] : v.problems).toEqual([]);
    });

    it('evaluates every reckoner and resolves every reading', () => {
      const doc = validDoc(seed);
      const snap = evaluateDocument(doc, seed.params);
      expect(snap.blocks.length).toBeGreaterThan(0);
      expect(snap.readings.length).toBeGreaterThan(0);
      expectCleanSnapshot(seed.seedKey, snap);
    });

    it('gives no procedure-check warnings', () => {
      const doc = validDoc(seed);
      expect(lintProcedure(doc, evaluateDocument(doc, seed.params))).toEqual([]);
    });

    it('opens with a danger note and confirms discharge below 60 V with a meter', () => {
      const doc = validDoc(seed);
      expect(doc.content[0]!.type).toBe('hazardNote');
      expect(doc.content[0]!.attrs!.level).toBe('danger');
      const { checkSteps } = extractBlocks(doc);
      expect(checkSteps.some((c) => /discharg/i.test(c.text) && /60 V/.test(c.text) && /meter/i.test(c.text))).toBe(true);
      const text = plainText(doc);
      expect(text).toMatch(/local electrical codes/i);
      expect(text).not.toMatch(/\b(transcript|lecture|course|talk)s?\b/i);
    });

    it('stays evaluable across the mains tolerance (−10 % … +10 %)', () => {
      const doc = validDoc(seed);
      for (const factor of [0.9, 1.1]) {
        const params = { ...seed.params, mainsVoltage: seed.params.mainsVoltage * factor };
        expectCleanSnapshot(`${seed.seedKey} at ×${factor} mains`, evaluateDocument(doc, params));
      }
    });

    it('wires mains inputs to the parameter: readings from mains-dependent reckoners rise with +10 % mains', () => {
      const doc = validDoc(seed);
      const dependent = mainsDependent(doc);
      expect(dependent.size, 'at least one reckoner reads the mainsVoltage parameter').toBeGreaterThan(0);
      // Every mains-voltage input of a reckoner is the parameter, never a typed number.
      walk(doc, (node) => {
        if (node.type !== 'reckoner') return;
        const inputs = node.attrs!.inputs as Record<string, unknown>;
        for (const key of ['mainsVoltage', 'mainsActual']) {
          if (key in inputs) expect(inputs[key], `${String(node.attrs!.name)}.${key}`).toEqual({ param: 'mainsVoltage' });
        }
      });
      const base = evaluateDocument(doc, seed.params);
      const high = evaluateDocument(doc, { ...seed.params, mainsVoltage: seed.params.mainsVoltage * 1.1 });
      expectCleanSnapshot(seed.seedKey, high);
      const refOf = new Map(
        extractBlocks(doc).readings.map((r) => [r.id, 'ref' in r.expected ? r.expected.ref : null] as const),
      );
      let moved = 0;
      for (const r of base.readings) {
        const h = high.readings.find((x) => x.id === r.id)!;
        const source = refOf.get(r.id);
        if (source && dependent.has(source.slice(0, source.indexOf('.')))) {
          expect(h.expected!, `${seed.seedKey}: ${r.id} (${source}) should rise with the mains`).toBeGreaterThan(r.expected!);
        }
        if (h.expected !== r.expected) moved++;
      }
      expect(moved, `${seed.seedKey}: readings that moved with the mains`).toBeGreaterThan(0);
    });
  });
});
