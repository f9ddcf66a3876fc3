import { and, eq, sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { auditLog, revisions, signatures } from '../../../../server/db/schema';
import { canonicalJson } from '../../../../server/modules/review/canonical';
import { verifySignature } from '../../../../server/modules/review/signatures';
import { createTestApp, demo, type TestApp } from '../../../support/test-app';
import {
  approve,
  doc,
  fuseBlock,
  goodDoc,
  inReview,
  newDraft,
  paragraph,
  params,
  reading,
} from './review-support';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

/** The database's own message for a refused statement (drizzle wraps it in "Failed query: …"). */
async function refusal(statement: ReturnType<typeof sql>, as: 'app' | 'owner' = 'owner') {
  const err = await (as === 'app' ? t.db : t.ownerDb).execute(statement).then(
    () => null,
    (e: Error & { cause?: Error }) => e,
  );
  expect(err, 'the statement should have been refused').not.toBeNull();
  return err!.cause?.message ?? err!.message;
}

const signaturesOf = (revisionId: string) =>
  t.db.select().from(signatures).where(eq(signatures.revisionId, revisionId));

describe('submitting a draft', () => {
  it('draft → in review; a second submit gets 409 naming the state', async () => {
    const { c, revision } = await newDraft(t);
    const res = await c
      .post(`/api/revisions/${revision.id}/submit`)
      .send({ changeReason: 'Test change.', lockVersion: revision.lockVersion });
    expect(res.status).toBe(200);
    expect(res.body.revision.state).toBe('in_review');
    expect(res.body.revision.submittedAt).toBeTruthy();
    const again = await c.post(`/api/revisions/${revision.id}/submit`).send({ changeReason: 'Test change.' });
    expect(again.status).toBe(409);
    expect(again.body).toMatchObject({ state: 'in_review' });
    expect(again.body.error).toMatch(/in review/);
    // Drafts in review can no longer be saved.
    const save = await c.put(`/api/revisions/${revision.id}`).send({
      title: 'Changed after submit',
      equipmentFamily: 'Guitar amplifier',
      equipmentModel: 'TC-18',
      tags: [],
      params,
      lockVersion: 2,
      document: goodDoc(),
    });
    expect(save.status).toBe(409);
  });

  it('a stale lockVersion is refused, so the author submits what they last saw', async () => {
    const { c, revision } = await newDraft(t);
    const res = await c
      .post(`/api/revisions/${revision.id}/submit`)
      .send({ changeReason: 'Test change.', lockVersion: revision.lockVersion - 1 });
    expect(res.status).toBe(409);
    expect(res.body.lockVersion).toBe(revision.lockVersion);
  });

  it('a draft with a reckoner error or an unresolved reading is refused, naming each', async () => {
    const broken = doc(paragraph('x'), fuseBlock('lots of amps'), reading('±5 %', 'fuse.noSuchOutput'));
    const { c, revision } = await newDraft(t, 'hal', broken);
    const res = await c.post(`/api/revisions/${revision.id}/submit`).send({ changeReason: 'Test change.' });
    expect(res.status).toBe(409);
    expect(res.body.state).toBe('draft');
    const blockIds = res.body.problems.map((p: { blockId: string }) => p.blockId);
    expect(blockIds).toContain('fuse-block-1');
    expect(blockIds).toContain('reading-bplus2');
    // The field is named in the registry's words, not by its internal path.
    expect(res.body.error).toMatch(
      /The Mains fuse block in “First power-up”: Winding 1 current \(AC rms\) is not a number \("lots of amps"\)/,
    );
    // Blocks by their labels, never by the internal names references use.
    expect(res.body.error).not.toMatch(/“fuse”/);
    expect(res.body.error).not.toMatch(/windings\.0\.amps/);
    const noTolerance = await newDraft(t, 'hal', doc(paragraph('x'), fuseBlock('0.1 A'), reading('')));
    const res2 = await noTolerance.c
      .post(`/api/revisions/${noTolerance.revision.id}/submit`)
      .send({ changeReason: 'Test change.' });
    expect(res2.status).toBe(409);
    expect(res2.body.problems[0]).toMatchObject({ blockId: 'reading-bplus2' });
    expect((await t.db.select().from(revisions).where(eq(revisions.id, revision.id)))[0]!.state).toBe(
      'draft',
    );
  });

  it('only an author who wrote or edited the draft may submit it; technicians never', async () => {
    const { revision } = await newDraft(t, 'hal');
    const ruth = await t.as('ruth');
    expect(
      (await ruth.post(`/api/revisions/${revision.id}/submit`).send({ changeReason: 'Test change.' })).status,
    ).toBe(403);
    const tom = await t.as('tom');
    expect(
      (await tom.post(`/api/revisions/${revision.id}/submit`).send({ changeReason: 'Test change.' })).status,
    ).toBe(403);
  });
});

describe('four eyes', () => {
  it('nobody approves what they authored or edited (403); authors and technicians cannot review at all', async () => {
    const dee = await t.as('dee');
    const own = await inReview(t, 'dee');
    const res = await approve(dee, own.revision.id, 'dee');
    expect(res.status).toBe(403);
    expect(res.body.error).toMatch(/another reviewer/);

    // Dee (reviewer + author) edits Hal's draft: she may not approve it either.
    const edited = await newDraft(t, 'hal');
    const meta = {
      title: 'TC-18 edited by Dee',
      equipmentFamily: 'Guitar amplifier',
      equipmentModel: 'TC-18',
      tags: [],
    };
    expect(
      (
        await dee
          .put(`/api/revisions/${edited.revision.id}`)
          .send({ ...meta, params, lockVersion: edited.revision.lockVersion, document: goodDoc('0.12 A') })
      ).status,
    ).toBe(200);
    expect(
      (
        await edited.c
          .post(`/api/revisions/${edited.revision.id}/submit`)
          .send({ changeReason: 'Test change.' })
      ).status,
    ).toBe(200);
    expect((await approve(dee, edited.revision.id, 'dee')).status).toBe(403);
    expect(
      (
        await dee
          .post(`/api/revisions/${edited.revision.id}/return`)
          .send({ password: demo.dee.password, comment: 'x' })
      ).status,
    ).toBe(403);

    const hal = await t.as('hal');
    expect((await approve(hal, edited.revision.id, 'hal')).status).toBe(403);
    const tom = await t.as('tom');
    expect((await approve(tom, edited.revision.id, 'tom')).status).toBe(403);
    expect(await signaturesOf(edited.revision.id)).toHaveLength(0);
    // Marek, who never touched it, may.
    expect((await approve(await t.as('marek'), edited.revision.id, 'marek')).status).toBe(200);
  });
});

describe('sign-off', () => {
  it('a wrong password → 401, no signature, an audit entry; the right one → one complete signature', async () => {
    const { revision } = await inReview(t);
    const marek = await t.as('marek');
    const wrong = await marek
      .post(`/api/revisions/${revision.id}/approve`)
      .send({ password: 'tallow-reviewer-demO', comment: 'ok' });
    expect(wrong.status).toBe(401);
    expect(await signaturesOf(revision.id)).toHaveLength(0);
    expect((await t.db.select().from(revisions).where(eq(revisions.id, revision.id)))[0]!.state).toBe(
      'in_review',
    );
    const failures = await t.db
      .select()
      .from(auditLog)
      .where(
        and(eq(auditLog.action, 'sign-off.failed'), sql`${auditLog.subject} like ${'%r' + revision.number}`),
      );
    expect(failures.length).toBeGreaterThanOrEqual(1);
    expect(JSON.stringify(failures)).not.toContain('tallow-reviewer-demO');

    const missing = await marek
      .post(`/api/revisions/${revision.id}/approve`)
      .send({ comment: 'no password' });
    expect(missing.status).toBe(400);
    expect(missing.body.fields[0].field).toBe('body.password');

    const before = Date.now();
    const ok = await approve(marek, revision.id, 'marek', 'Fuse sizing checked.');
    expect(ok.status).toBe(200);
    expect(ok.body.revision.state).toBe('approved');
    expect(ok.body.signature).toMatchObject({
      meaning: 'approved',
      signer: { displayName: 'Marek Vos', role: 'reviewer' },
      comment: 'Fuse sizing checked.',
      verified: true,
    });
    const rows = await signaturesOf(revision.id);
    expect(rows).toHaveLength(1);
    const sig = rows[0]!;
    expect(sig.contentHash).toMatch(/^[0-9a-f]{64}$/);
    expect(sig.signerEmail).toBe(demo.marek.email);
    expect(sig.reauthAuditId).toBeTypeOf('number');
    expect(sig.revisionNumber).toBe(revision.number);
    expect(Math.abs(sig.signedAt.getTime() - before)).toBeLessThan(60_000);
    const audit = await t.db.select().from(auditLog).where(eq(auditLog.action, 'revision.approved'));
    expect(
      audit.some(
        (a) =>
          a.details.signatureId === sig.id && a.details.from === 'in_review' && a.details.to === 'approved',
      ),
    ).toBe(true);
  });

  it('the signature verifies; a superuser edit that bypasses the trigger is reported as a mismatch', async () => {
    const { revision } = await inReview(t);
    const marek = await t.as('marek');
    const ok = await approve(marek, revision.id, 'marek');
    const sigId = ok.body.signature.id;
    const good = await marek.get(`/api/signatures/${sigId}/verify`);
    expect(good.status).toBe(200);
    expect(good.body.verified).toBe(true);
    expect(good.body.currentHash).toBe(good.body.storedHash);

    // A one-character edit with the triggers switched off (only a superuser can do this).
    await t.ownerDb.transaction(async (tx) => {
      await tx.execute(sql`set local session_replication_role = replica`);
      await tx.execute(sql`update revisions set plain_text = plain_text || '.' where id = ${revision.id}`);
    });
    const bad = await marek.get(`/api/signatures/${sigId}/verify`);
    expect(bad.body.verified).toBe(false);
    expect(bad.body.currentHash).not.toBe(bad.body.storedHash);
    const listed = await marek.get(`/api/revisions/${revision.id}/signatures`);
    expect(listed.body.signatures[0].verified).toBe(false);
  });

  it('a signature copied to another revision does not verify there', async () => {
    const a = await inReview(t);
    const b = await inReview(t);
    const marek = await t.as('marek');
    await approve(marek, a.revision.id, 'marek');
    await approve(marek, b.revision.id, 'marek');
    const [sigA] = await signaturesOf(a.revision.id);
    expect((await verifySignature(t.db, t.files, sigA!)).verified).toBe(true);
    expect((await verifySignature(t.db, t.files, { ...sigA!, revisionId: b.revision.id })).verified).toBe(
      false,
    );
  });

  it('canonical JSON sorts keys at every depth, so key order never changes a hash', () => {
    expect(canonicalJson({ b: 1, a: { d: [3, { z: 1, y: 2 }], c: null } })).toBe(
      '{"a":{"c":null,"d":[3,{"y":2,"z":1}]},"b":1}',
    );
    expect(canonicalJson({ a: 1, skip: undefined })).toBe('{"a":1}');
  });
});

describe('the database guards reviewed records', () => {
  it('refuses a direct UPDATE of an approved revision’s content, and UPDATE/DELETE of signatures and audit rows', async () => {
    const { revision } = await inReview(t);
    await approve(await t.as('marek'), revision.id, 'marek');
    expect(
      await refusal(
        sql`update revisions set document = '{"type":"doc","content":[]}'::jsonb where id = ${revision.id}`,
      ),
    ).toMatch(/content cannot change/);
    expect(await refusal(sql`update revisions set title = 'renamed' where id = ${revision.id}`)).toMatch(
      /content cannot change/,
    );
    expect(await refusal(sql`update revisions set state = 'draft' where id = ${revision.id}`)).toMatch(
      /cannot go from approved to draft/,
    );
    expect(await refusal(sql`delete from revisions where id = ${revision.id}`)).toMatch(/cannot be deleted/);
    expect(
      await refusal(sql`update signatures set comment = 'forged' where revision_id = ${revision.id}`),
    ).toMatch(/append-only/);
    expect(await refusal(sql`delete from signatures where revision_id = ${revision.id}`)).toMatch(
      /append-only/,
    );
    expect(await refusal(sql`truncate signatures`)).toMatch(/append-only/);
    expect(await refusal(sql`update audit_log set action = 'nothing'`)).toMatch(/append-only/);
    expect(await refusal(sql`delete from audit_log`)).toMatch(/append-only/);
    // The application role is refused before any trigger runs: it holds no UPDATE, DELETE or
    // TRUNCATE on the append-only records (21 CFR 11.10(e): an audit trail that never obscures
    // earlier entries; ISO 9001:2015 7.5.3 protection from unintended alteration), and cannot switch triggers off.
    for (const statement of [
      sql`update signatures set comment = 'forged' where revision_id = ${revision.id}`,
      sql`delete from signatures where revision_id = ${revision.id}`,
      sql`truncate signatures`,
      sql`update audit_log set action = 'nothing'`,
      sql`delete from audit_log`,
      sql`update run_signatures set signer_name = 'x'`,
      sql`delete from run_entry_history`,
      sql`delete from review_comments`,
    ]) {
      expect(await refusal(statement, 'app')).toMatch(/permission denied/);
    }
    expect(await refusal(sql`alter table signatures disable trigger signatures_append_only`, 'app')).toMatch(
      /must be owner/,
    );
    expect(
      await refusal(sql`update revisions set title = 'renamed' where id = ${revision.id}`, 'app'),
    ).toMatch(/content cannot change/);
    expect(await refusal(sql`select pg_read_file('/etc/passwd')`, 'app')).toMatch(/permission denied/);
    const [row] = await t.db.select().from(revisions).where(eq(revisions.id, revision.id));
    expect(row!.title).not.toBe('renamed');
    expect(await signaturesOf(revision.id)).toHaveLength(1);
  });

  it('refuses a signature for a revision not in the state it claims', async () => {
    const { revision } = await inReview(t);
    const [row] = await t.db.select().from(revisions).where(eq(revisions.id, revision.id));
    await expect(
      t.db.insert(signatures).values({
        revisionId: row!.id,
        procedureId: row!.procedureId,
        revisionNumber: row!.number,
        signerId: row!.authorId,
        signerName: 'x',
        signerEmail: 'x@example.com',
        signerRole: 'reviewer',
        meaning: 'approved',
        contentHash: 'f'.repeat(64),
      }),
    ).rejects.toThrow();
  });
});

describe('transitions', () => {
  it('illegal transitions get 409 naming the current state', async () => {
    const marek = await t.as('marek');
    const draft = await newDraft(t);
    const d = await approve(marek, draft.revision.id, 'marek');
    expect(d.status).toBe(409);
    expect(d.body.state).toBe('draft');
    expect(d.body.error).toMatch(/is a draft/);

    const r = await inReview(t);
    const returned = await marek
      .post(`/api/revisions/${r.revision.id}/return`)
      .send({ password: demo.marek.password, comment: 'The heater winding current is missing.' });
    expect(returned.status).toBe(200);
    expect(returned.body.revision.state).toBe('returned');
    expect(returned.body.signature).toMatchObject({
      meaning: 'returned',
      comment: 'The heater winding current is missing.',
      verified: true,
    });
    const again = await approve(marek, r.revision.id, 'marek');
    expect(again.status).toBe(409);
    expect(again.body).toMatchObject({ state: 'returned' });
    expect(
      (await r.c.post(`/api/revisions/${r.revision.id}/submit`).send({ changeReason: 'Test change.' })).body
        .state,
    ).toBe('returned');

    const a = await inReview(t);
    await approve(marek, a.revision.id, 'marek');
    const back = await marek
      .post(`/api/revisions/${a.revision.id}/return`)
      .send({ password: demo.marek.password, comment: 'late' });
    expect(back.status).toBe(409);
    expect(back.body.state).toBe('approved');
    expect((await approve(marek, a.revision.id, 'marek')).body.error).toMatch(/is approved/);
  });

  it('returning needs a comment (400 naming the field)', async () => {
    const r = await inReview(t);
    const res = await (
      await t.as('marek')
    )
      .post(`/api/revisions/${r.revision.id}/return`)
      .send({ password: demo.marek.password, comment: '  ' });
    expect(res.status).toBe(400);
    expect(res.body.fields[0]).toMatchObject({ field: 'body.comment' });
  });

  it('after a returned first revision, the next draft starts from it as revision 2', async () => {
    const r = await inReview(t);
    const returned = await (
      await t.as('marek')
    )
      .post(`/api/revisions/${r.revision.id}/return`)
      .send({ password: demo.marek.password, comment: 'Add the discharge check before the HT test.' });
    expect(returned.status).toBe(200);
    const next = await r.c.post(`/api/procedures/${r.revision.procedureId}/drafts`);
    expect(next.status).toBe(201);
    expect(next.body.revision).toMatchObject({ number: 2, state: 'draft' });
    const first = (await r.c.get(`/api/revisions/${r.revision.id}`)).body.revision;
    expect(next.body.revision.document).toEqual(first.document);
  });

  it('approving revision 2 supersedes revision 1, which stays readable; the review shows what changed', async () => {
    const marek = await t.as('marek');
    const first = await inReview(
      t,
      'hal',
      goodDoc('0.1 A', '±5 %', 'Bring the unit up on the current-limited supply and watch the HT.'),
    );
    expect((await approve(marek, first.revision.id, 'marek')).status).toBe(200);

    const next = await first.c.post(`/api/procedures/${first.revision.procedureId}/drafts`).send({});
    expect(next.status).toBe(201);
    const rev2 = next.body.revision;
    expect(rev2.number).toBe(2);
    const saved = await first.c.put(`/api/revisions/${rev2.id}`).send({
      ...first.meta,
      params,
      lockVersion: rev2.lockVersion,
      document: goodDoc('0.3 A', '±10 %', 'Bring the unit up on the variac and watch the HT.'),
    });
    expect(saved.status).toBe(200);
    expect(
      (await first.c.post(`/api/revisions/${rev2.id}/submit`).send({ changeReason: 'Test change.' })).status,
    ).toBe(200);

    const review = await marek.get(`/api/revisions/${rev2.id}/review`);
    expect(review.status).toBe(200);
    const v = review.body.review;
    expect(v.base).toMatchObject({ id: first.revision.id, number: 1 });
    expect(v.canDecide).toBe(true);
    const tol = v.valueChanges.find(
      (c: { subject: string; label: string }) => c.subject === 'B+2' && c.label === 'tolerance',
    );
    expect(tol).toMatchObject({ kind: 'reading', before: '±5 %', after: '±10 %' });
    const fuseChanges = v.valueChanges.filter(
      (c: { kind: string; subject: string }) => c.kind === 'output' && c.subject === 'fuse',
    );
    expect(fuseChanges.length).toBeGreaterThan(0);
    for (const f of fuseChanges) expect(f.before).not.toBe(f.after);
    const changed = v.textDiff.find((l: { kind: string }) => l.kind === 'changed');
    expect(changed.parts).toEqual(
      expect.arrayContaining([
        { op: 'del', text: 'current-limited supply' },
        { op: 'add', text: 'variac' },
      ]),
    );

    const ok = await approve(marek, rev2.id, 'marek');
    expect(ok.status).toBe(200);
    expect(ok.body.superseded).toMatchObject({ id: first.revision.id, number: 1 });
    const tom = await t.as('tom');
    const old = await tom.get(`/api/revisions/${first.revision.id}`);
    expect(old.status).toBe(200);
    expect(old.body.revision.state).toBe('superseded');
    expect(old.body.revision.snapshot.readings[0].toleranceText).toBe('±5 %');
    const oldSigs = await tom.get(`/api/revisions/${first.revision.id}/signatures`);
    expect(oldSigs.body.signatures).toMatchObject([{ meaning: 'approved', verified: true }]);
    const supersededAudit = await t.db
      .select()
      .from(auditLog)
      .where(eq(auditLog.action, 'revision.superseded'));
    expect(supersededAudit.some((a) => a.details.revisionId === first.revision.id)).toBe(true);
  });

  it('withdrawing a procedure: reviewer or admin, signed with a reason; a second withdrawal is 409', async () => {
    const r = await inReview(t);
    const marek = await t.as('marek');
    await approve(marek, r.revision.id, 'marek');
    const url = `/api/procedures/${r.revision.procedureId}/withdraw`;
    expect(
      (await (await t.as('tom')).post(url).send({ password: demo.tom.password, reason: 'x' })).status,
    ).toBe(403);
    expect((await r.c.post(url).send({ password: demo.hal.password, reason: 'x' })).status).toBe(403);
    const admin = await t.as('admin');
    expect((await admin.post(url).send({ password: demo.admin.password })).status).toBe(400);
    expect(
      (await admin.post(url).send({ password: 'wrong', reason: 'Superseded by the TC-18 mk2 procedure.' }))
        .status,
    ).toBe(401);
    const res = await admin
      .post(url)
      .send({ password: demo.admin.password, reason: 'Superseded by the TC-18 mk2 procedure.' });
    expect(res.status).toBe(200);
    expect(res.body.revision.state).toBe('withdrawn');
    expect(res.body.signature).toMatchObject({
      meaning: 'withdrawn',
      signer: { role: 'admin' },
      comment: 'Superseded by the TC-18 mk2 procedure.',
      verified: true,
    });
    const again = await admin.post(url).send({ password: demo.admin.password, reason: 'again' });
    expect(again.status).toBe(409);
    expect(again.body.state).toBe('withdrawn');
  });

  it('fifty parallel approvals of one revision produce exactly one signature', async () => {
    const { revision } = await inReview(t);
    const marek = await t.as('marek');
    const results = await Promise.all(Array.from({ length: 50 }, () => approve(marek, revision.id, 'marek')));
    const statuses = results.map((r) => r.status);
    expect(statuses.filter((s) => s === 200)).toHaveLength(1);
    // The rest lost the race (409) or were refused before their password was checked: at most five
    // of one person's passwords are checked at once (429, tests/server/modules/auth/auth-limits.test.ts).
    expect(statuses.filter((s) => s === 409 || s === 429)).toHaveLength(49);
    expect(statuses.filter((s) => s === 409).length).toBeGreaterThanOrEqual(1);
    expect(await signaturesOf(revision.id)).toHaveLength(1);
  }, 60_000);
});

describe('review queue and comments', () => {
  it('reviewers see the queue with author and age; their own work is marked; technicians are refused', async () => {
    const mine = await inReview(t, 'dee');
    const dee = await t.as('dee');
    const q = await dee.get('/api/review/queue');
    expect(q.status).toBe(200);
    const item = q.body.items.find((i: { revisionId: string }) => i.revisionId === mine.revision.id);
    expect(item).toMatchObject({ number: 1, author: { displayName: 'Dee Sandoval' }, ownWork: true });
    expect(item.ageSeconds).toBeGreaterThanOrEqual(0);
    const mq = await (await t.as('marek')).get('/api/review/queue');
    expect(mq.body.items.find((i: { revisionId: string }) => i.revisionId === mine.revision.id).ownWork).toBe(
      false,
    );
    expect(q.body.items.every((i: { revisionId: string }) => typeof i.revisionId === 'string')).toBe(true);
    expect((await (await t.as('tom')).get('/api/review/queue')).status).toBe(403);
    expect((await (await t.as('hal')).get('/api/review/queue')).status).toBe(403);
  });

  it('authors and reviewers comment on a revision or one block; bad block ids are refused', async () => {
    const r = await inReview(t);
    const marek = await t.as('marek');
    const whole = await marek
      .post(`/api/revisions/${r.revision.id}/comments`)
      .send({ body: 'Please add the standby switch check.' });
    expect(whole.status).toBe(201);
    const onBlock = await r.c
      .post(`/api/revisions/${r.revision.id}/comments`)
      .send({ body: 'Tolerance follows the TC-18 build sheet.', blockId: 'reading-bplus2' });
    expect(onBlock.status).toBe(201);
    expect(onBlock.body.comment).toMatchObject({
      blockId: 'reading-bplus2',
      blockLabel: 'Reading “B+2”',
      author: { displayName: 'Hal Brennan' },
    });
    const bad = await marek
      .post(`/api/revisions/${r.revision.id}/comments`)
      .send({ body: 'x', blockId: 'no-such-block' });
    expect(bad.status).toBe(400);
    expect(bad.body.fields[0].field).toBe('body.blockId');
    expect((await marek.post(`/api/revisions/${r.revision.id}/comments`).send({ body: '' })).status).toBe(
      400,
    );
    expect(
      (await (await t.as('tom')).post(`/api/revisions/${r.revision.id}/comments`).send({ body: 'x' })).status,
    ).toBe(403);
    const view = await marek.get(`/api/revisions/${r.revision.id}/review`);
    expect(view.body.review.comments.map((c: { body: string }) => c.body)).toEqual([
      'Please add the standby switch check.',
      'Tolerance follows the TC-18 build sheet.',
    ]);
  });

  it('technicians cannot open review pages or see signatures of unpublished revisions', async () => {
    const r = await inReview(t);
    const tom = await t.as('tom');
    expect((await tom.get(`/api/revisions/${r.revision.id}/review`)).status).toBe(403);
    expect((await tom.get(`/api/revisions/${r.revision.id}/signatures`)).status).toBe(404);
  });
});

describe('demo content', () => {
  it('every seeded approved procedure carries a reviewer signature that verifies', async () => {
    const tom = await t.as('tom');
    const seeded = await t.db
      .select()
      .from(revisions)
      .where(sql`${revisions.procedureId} in (select id from procedures where seed_key is not null)`);
    for (const rev of seeded) {
      const res = await tom.get(`/api/revisions/${rev.id}/signatures`);
      expect(res.status).toBe(200);
      expect(res.body.signatures).toHaveLength(1);
      expect(res.body.signatures[0]).toMatchObject({
        meaning: 'approved',
        verified: true,
        signer: { role: 'reviewer' },
      });
      expect(res.body.signatures[0].signer.id).not.toBe(rev.authorId);
    }
  });
});
