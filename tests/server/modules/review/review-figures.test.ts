import { sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../../../support/test-app';
import { approve, doc, inReview, paragraph, params } from './review-support';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

const reckoner = (id: string, name: string, kind: string, inputs: Record<string, unknown>) => ({
  type: 'reckoner',
  attrs: { id, name, kind, inputs },
});
/** An HT winding rated 250 V; "Actual mains" left empty, so it follows the measured mains. */
const ht = (name = 'ht') =>
  reckoner('figures-ht', name, 'peak-no-load', {
    windingVoltage: '250 V',
    rectifier: 'silicon-bridge',
    mainsNominal: { param: 'mainsNominal' },
  });
const bleed = (from = 'ht') =>
  reckoner('figures-bleed', 'bleed', 'bleeder', {
    capacitance: '47 µF',
    chargedVoltage: { ref: `${from}.noLoadDc` },
    bleederResistance: '220 kΩ',
  });
const fuse = (efficiency = '85 %') =>
  reckoner('figures-fuse', 'fuse', 'mains-fuse', {
    windings: [{ label: 'HT', volts: '250 V', amps: '100 mA' }],
    mainsVoltage: { param: 'mainsNominal' },
    efficiency,
  });
const hazard = {
  type: 'hazardNote',
  attrs: { id: 'figures-hazard', level: 'danger' },
  content: [paragraph('Lethal voltages; discharge and verify before touching.')],
};
const document = (name = 'ht', efficiency = '85 %') =>
  doc(
    hazard,
    paragraph('Bring the unit up on the current-limited supply.'),
    fuse(efficiency),
    ht(name),
    bleed(name),
  );

type Input = {
  label: string;
  formatted: string;
  measure: string | null;
  source: { kind: string; [k: string]: unknown };
  sourceText: string;
};
type Block = { id: string; name: string; inputs: Input[]; outputs: { key: string }[] };
const block = (blocks: Block[], id: string) => blocks.find((b) => b.id === id)!;
const input = (b: Block, label: string) => b.inputs.find((i) => i.label === label)!;

describe('the review view carries what was assumed', () => {
  it('every block’s inputs with their sources, outputs in declaration order after PostgreSQL’s jsonb, and a compact first revision', async () => {
    const { revision } = await inReview(t, 'hal', document());
    const marek = await t.as('marek');
    const res = await marek.get(`/api/revisions/${revision.id}/review`);
    expect(res.status).toBe(200);
    const v = res.body.review;
    expect(v.base).toBeNull();

    const blocks: Block[] = v.reckoners;
    expect(blocks.map((b) => b.name)).toEqual(['fuse', 'ht', 'bleed']);
    const peak = block(blocks, 'figures-ht');
    expect(input(peak, 'Winding voltage (rms)')).toMatchObject({
      formatted: '250 V',
      measure: 'rms',
      source: { kind: 'typed' },
      sourceText: 'typed',
    });
    expect(input(peak, 'Nominal mains')).toMatchObject({
      source: { kind: 'param', param: 'mainsNominal', followed: false },
    });
    expect(input(peak, 'Actual mains')).toMatchObject({
      formatted: `${params.mainsVoltage} V`,
      source: { kind: 'param', param: 'mainsVoltage', followed: true },
    });
    expect(input(block(blocks, 'figures-bleed'), 'Charged voltage')).toMatchObject({
      measure: 'dc',
      source: {
        kind: 'ref',
        blockId: 'figures-ht',
        block: 'ht',
        output: 'noLoadDc',
        outputLabel: 'No-load DC at the reservoir',
      },
    });
    expect(
      input(block(blocks, 'figures-fuse'), 'Secondary windings, row 1 (HT): Winding current (AC rms)'),
    ).toMatchObject({ formatted: '100 mA', measure: 'rms' });
    // jsonb stores "scaled" before "peakVoltage"; the view gives the order declared in shared/reckoners/peak-no-load.ts.
    expect(peak.outputs.map((o) => o.key).slice(0, 3)).toEqual(['windingVoltage', 'peakVoltage', 'noLoadDc']);
    const [stored] = await t.db
      .execute<{ first: string }>(
        sql`select (select k from jsonb_object_keys(snapshot->'blocks'->1->'outputs') k limit 1) as first from revisions where id = ${revision.id}`,
      )
      .then((r) => r.rows);
    expect(stored!.first).not.toBe('windingVoltage');

    // A first revision: every row new, no output of the fuse beyond its key ones.
    expect(v.valueChanges.every((c: { before: unknown }) => c.before === null)).toBe(true);
    expect(
      v.valueChanges
        .filter((c: { kind: string; subject: string }) => c.kind === 'output' && c.subject === 'fuse')
        .map((c: { label: string }) => c.label),
    ).toEqual([
      'Total secondary load',
      'Primary current',
      'Fuse',
      'Surge inside the guaranteed holding time',
    ]);
    expect(v.valueChanges.find((c: { label: string }) => c.label === 'Transformer efficiency')).toMatchObject(
      { kind: 'input', after: '85 %', sourceAfter: 'typed' },
    );

    // The reader's view of the same revision carries the same description.
    const read = await marek.get(`/api/revisions/${revision.id}`);
    expect(read.body.revision.reckoners).toEqual(v.reckoners);
  });

  it('a snapshot stored without inputs and sources is described from the document', async () => {
    const { revision } = await inReview(t, 'hal', document());
    await t.ownerDb.transaction(async (tx) => {
      await tx.execute(sql`set local session_replication_role = replica`);
      await tx.execute(sql`update revisions set snapshot = jsonb_set(snapshot, '{blocks}',
        (select jsonb_agg(b - 'input' - 'sources') from jsonb_array_elements(snapshot->'blocks') b)) where id = ${revision.id}`);
    });
    const res = await (await t.as('marek')).get(`/api/revisions/${revision.id}/review`);
    expect(res.status).toBe(200);
    const peak = block(res.body.review.reckoners, 'figures-ht');
    expect(input(peak, 'Actual mains').source).toMatchObject({
      kind: 'param',
      param: 'mainsVoltage',
      followed: true,
    });
    expect(input(peak, 'Winding voltage (rms)')).toMatchObject({
      formatted: '250 V',
      source: { kind: 'typed' },
    });
  });

  it('revision 2 follows a renamed block by its id and lists the changed input', async () => {
    const first = await inReview(t, 'hal', document('ht', '85 %'));
    const marek = await t.as('marek');
    expect((await approve(marek, first.revision.id, 'marek')).status).toBe(200);
    const next = await first.c.post(`/api/procedures/${first.revision.procedureId}/drafts`).send({});
    const rev2 = next.body.revision;
    const saved = await first.c
      .put(`/api/revisions/${rev2.id}`)
      .send({ ...first.meta, params, lockVersion: rev2.lockVersion, document: document('hv', '80 %') });
    expect(saved.status).toBe(200);
    expect(
      (await first.c.post(`/api/revisions/${rev2.id}/submit`).send({ changeReason: 'Test change.' })).status,
    ).toBe(200);

    const changes = (await marek.get(`/api/revisions/${rev2.id}/review`)).body.review.valueChanges as {
      kind: string;
      subject: string;
      label: string;
      before: string | null;
      after: string | null;
      renamedFrom?: string;
    }[];
    expect(changes.filter((c) => c.kind === 'block')).toEqual([
      expect.objectContaining({ subject: 'hv', renamedFrom: 'ht', before: 'ht', after: 'hv' }),
    ]);
    expect(changes.filter((c) => c.subject === 'hv' || c.subject === 'bleed')).toHaveLength(1); // renamed, nothing else moved
    expect(changes.find((c) => c.kind === 'input')).toMatchObject({
      subject: 'fuse',
      label: 'Transformer efficiency',
      before: '85 %',
      after: '80 %',
    });
    expect(changes.some((c) => c.before === null || c.after === null)).toBe(false);
  });
});
