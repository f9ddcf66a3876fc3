/**
 * The demo procedures in content-seed/procedures: each file must be a document the server would
 * accept as it stands — valid against the node schema, every reckoner evaluating, every reading
 * resolving to a band, and no warnings from the procedure check — and its mains-voltage inputs
 * must be wired to the procedure parameters: the measured mains (mainsVoltage) everywhere a bench
 * run at the measured mains should move the expected values, the nominal mains (mainsNominal) for
 * the fuse, which is chosen once and must not change rating on the bench. Every dropping-resistor
 * ladder stage names the resistor fitted in the unit, so its node voltages follow the mains.
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
import { parseQuantity } from '../../shared/units/parse';

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
    if (Object.keys(o).length === 1 && typeof o.ref === 'string')
      out.push(o.ref.slice(0, o.ref.indexOf('.')));
    else Object.values(o).forEach((v) => refsOf(v, out));
  }
  return out;
}

/** Names of reckoners whose result depends on the measured mains, directly or through references. */
function mainsDependent(doc: ProcedureDoc): Set<string> {
  const { reckoners } = extractBlocks(doc);
  const dependent = new Set(reckoners.filter((r) => usesParam(r.inputs, 'mainsVoltage')).map((r) => r.name));
  for (let changed = true; changed;) {
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

/** A numeric output of an evaluated block, by "block.output". */
function outputOf(snap: Snapshot, ref: string): number {
  const dot = ref.indexOf('.');
  const block = snap.blocks.find((b) => b.name === ref.slice(0, dot));
  if (!block?.ok) throw new Error(`block of "${ref}" did not evaluate`);
  const out = block.outputs[ref.slice(dot + 1)];
  if (!out || typeof out.value !== 'number') throw new Error(`no numeric output "${ref}"`);
  return out.value;
}

/** The value a reckoner input takes in a snapshot: a reference, a parameter or a plain number. */
function inputValue(snap: Snapshot, value: unknown): number {
  if (typeof value === 'number') return value;
  if (value && typeof value === 'object' && 'ref' in value)
    return outputOf(snap, String((value as { ref: string }).ref));
  if (value && typeof value === 'object' && 'param' in value)
    return snap.params[(value as { param: string }).param as keyof ProcedureParams] as number;
  throw new Error(`cannot resolve input ${JSON.stringify(value)} in this test`);
}

interface LadderStage {
  label?: string;
  fittedResistance?: unknown;
}

/** Findings of the procedure check that are right about the demo content (none at present). */
const RIGHT_FINDINGS: Record<string, { code: string; blockId: string | null }[]> = {};

const people = (JSON.parse(readFileSync(PEOPLE, 'utf8')) as { people: { email: string; roles: string[] }[] })
  .people;
const rolesOf = (email: string) => people.find((p) => p.email === email)?.roles ?? [];

describe('content-seed procedures', () => {
  it('has at least four procedure files', () => {
    expect(files.length).toBeGreaterThanOrEqual(4);
  });

  it('the demo library uses the choke-input, LC-section, rectifier-swap, mains-conversion and part-rating blocks', () => {
    const blocks = files.flatMap((f) => extractBlocks(validDoc(load(f))).reckoners);
    const kinds = new Set(blocks.map((r) => r.kind));
    for (const kind of ['choke-input', 'rectifier-substitution', 'mains-conversion', 'part-ratings'])
      expect(kinds, kind).toContain(kind);
    const lcStages = blocks
      .filter((r) => r.kind === 'dropper-ladder')
      .flatMap((r) => (r.inputs as unknown as { stages: { element?: string }[] }).stages)
      .filter((st) => st.element === 'choke');
    expect(lcStages.length).toBeGreaterThan(0);
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
      expect(['TC-18', 'TC-30H', 'TC-35M', 'TC-5R']).toContain(seed.equipmentModel);
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

    it('gives no procedure-check warnings beyond the reckoners’ own cautions and the findings listed as right', () => {
      const doc = validDoc(seed);
      const findings = lintProcedure(doc, evaluateDocument(doc, seed.params)).filter(
        (w) => w.code !== 'reckoner-caution',
      );
      expect(findings.map((w) => ({ code: w.code, blockId: w.blockId }))).toEqual(
        RIGHT_FINDINGS[seed.seedKey] ?? [],
      );
    });

    it('opens with a danger note stating the live-work cautions, and verifies the discharge below 60 V', () => {
      const doc = validDoc(seed);
      expect(doc.content[0]!.type).toBe('hazardNote');
      expect(doc.content[0]!.attrs!.level).toBe('danger');
      expect(doc.content[0]!.attrs!.flags).toEqual({
        oneHand: true,
        isolation: true,
        currentLimited: true,
        discharge: true,
      });
      const { checkSteps } = extractBlocks(doc);
      const verified = checkSteps.filter((c) => c.kind === 'discharge-verified');
      expect(verified.length).toBeGreaterThan(0);
      for (const c of verified) {
        expect(c.threshold).toBe('60 V');
        expect(c.text).toMatch(/meter/i);
      }
      const text = plainText(doc);
      expect(text).toMatch(/local electrical codes/i);
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
          if (!(key in inputs)) continue;
          // The fuse is sized at the nominal mains; everything else follows the measured mains.
          const param = node.attrs!.kind === 'mains-fuse' ? 'mainsNominal' : 'mainsVoltage';
          expect(inputs[key], `${String(node.attrs!.name)}.${key}`).toEqual({ param });
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
          expect(
            h.expected!,
            `${seed.seedKey}: ${r.id} (${source}) should rise with the mains`,
          ).toBeGreaterThan(r.expected!);
        }
        if (h.expected !== r.expected) moved++;
      }
      expect(moved, `${seed.seedKey}: readings that moved with the mains`).toBeGreaterThan(0);

      // Ladder nodes rise because the fitted resistors are fixed, not by luck of rounding: each
      // node moves by exactly the rise of the ladder's start voltage (fixed node currents).
      for (const ladder of extractBlocks(doc).reckoners.filter((r) => r.kind === 'dropper-ladder')) {
        const inputs = ladder.inputs as unknown as { startVoltage: unknown; stages: LadderStage[] };
        const startRise = inputValue(high, inputs.startVoltage) - inputValue(base, inputs.startVoltage);
        expect(startRise, `${seed.seedKey}: ${ladder.name} start rises with the mains`).toBeGreaterThan(0);
        inputs.stages.forEach((_, i) => {
          const ref = `${ladder.name}.stage${i + 1}.nodeVoltage`;
          const rise = outputOf(high, ref) - outputOf(base, ref);
          expect(
            Math.abs(rise - startRise),
            `${seed.seedKey}: ${ref} rises ${rise} V, start ${startRise} V`,
          ).toBeLessThan(1e-9 * Math.abs(startRise) + 1e-9);
        });
        const ladderReadings = base.readings.filter(
          (r) => refOf.get(r.id)?.startsWith(`${ladder.name}.`) && /\.nodeVoltage$/.test(refOf.get(r.id)!),
        );
        expect(ladderReadings.length, `${seed.seedKey}: readings bound to ${ladder.name} node voltages`).toBe(
          inputs.stages.length,
        );
        for (const r of ladderReadings) {
          const h = high.readings.find((x) => x.id === r.id)!;
          expect(h.expected! - r.expected!, `${seed.seedKey}: ${r.id}`).toBeCloseTo(startRise, 6);
        }
      }
    });

    it('sizes the fuse at the nominal mains: the rating does not change with the measured mains', () => {
      const doc = validDoc(seed);
      const fuses = extractBlocks(doc).reckoners.filter((r) => r.kind === 'mains-fuse');
      for (const fuse of fuses) {
        expect(
          (fuse.inputs as Record<string, unknown>).mainsVoltage,
          `${seed.seedKey}: ${fuse.name}.mainsVoltage`,
        ).toEqual({ param: 'mainsNominal' });
      }
      const base = evaluateDocument(doc, seed.params);
      for (const factor of [0.9, 1.1]) {
        const other = evaluateDocument(doc, {
          ...seed.params,
          mainsVoltage: seed.params.mainsVoltage * factor,
        });
        for (const fuse of fuses) {
          expect(
            outputOf(other, `${fuse.name}.fuseRating`),
            `${seed.seedKey}: ${fuse.name} at ×${factor} mains`,
          ).toBe(outputOf(base, `${fuse.name}.fuseRating`));
        }
      }
    });

    it('names the fitted resistor on every dropping-resistor ladder stage, as the procedure text lists it', () => {
      const doc = validDoc(seed);
      const text = plainText(doc);
      const snap = evaluateDocument(doc, seed.params);
      for (const ladder of extractBlocks(doc).reckoners.filter((r) => r.kind === 'dropper-ladder')) {
        const stages = (ladder.inputs as unknown as { stages: LadderStage[] }).stages;
        expect(stages.length).toBeGreaterThan(0);
        stages.forEach((st, i) => {
          const where = `${seed.seedKey}: ${ladder.name} stage ${i + 1} (${st.label ?? ''})`;
          expect(typeof st.fittedResistance, `${where} fitted resistor`).toBe('string');
          const fitted = st.fittedResistance as string;
          // The part the unit description lists, e.g. "4k7 2 W to B+2".
          expect(text, `${where}: "${fitted}" in the procedure text`).toMatch(
            new RegExp(`(^|[^0-9A-Za-z])${fitted}([^0-9A-Za-z]|$)`),
          );
          // The reckoner computes the node with that part.
          expect(outputOf(snap, `${ladder.name}.stage${i + 1}.resistance`), where).toBe(
            parseQuantity(fitted, 'Ω').value,
          );
        });
      }
    });
  });
});
