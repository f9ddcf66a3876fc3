import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, demo, type TestApp } from '../../../support/test-app';
import { approve, inReview } from '../review/review-support';
import { setPasswordTokenMailedTo } from '../../../support/mailed-link';
import { parseMails, setPasswordToken } from '../../../support/parsed-mail';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({}, { mail: true });
});
afterAll(() => t.close());

/**
 * A transition starts a background flush right after its commit; a flush() called while a pass is
 * running joins that pass, which may have read the outbox before the latest commit. A second
 * flush starts a fresh pass that sees everything committed so far.
 */
async function deliverAll() {
  await t.mailer!.flush();
  await t.mailer!.flush();
}

describe('the audit log page API', () => {
  it('records state changes, sign-offs, sign-in failures, role changes and deactivations; admins filter them', async () => {
    const r = await inReview(t);
    await approve(await t.as('marek'), r.revision.id, 'marek');
    const bad = t.client();
    await bad.signIn(demo.tom.email, 'not-his-password');
    const admin = await t.as('admin');
    const people = (await admin.get('/api/people')).body.people as { id: string; email: string }[];
    const sam = people.find((p) => p.email === demo.sam.email)!;
    expect(
      (await admin.patch(`/api/people/${sam.id}`).send({ roles: ['technician', 'author'] })).status,
    ).toBe(200);
    expect((await admin.patch(`/api/people/${sam.id}`).send({ active: false })).status).toBe(200);

    const all = await admin.get('/api/audit?pageSize=200');
    expect(all.status).toBe(200);
    const actions = new Set(all.body.entries.map((e: { action: string }) => e.action));
    for (const a of [
      'revision.submitted',
      'revision.approved',
      'sign-off.reauthenticated',
      'sign-in.failed',
      'person.roles-changed',
      'person.deactivated',
    ])
      expect(actions).toContain(a);

    // Signed run sheets (the demo's, written through recordAudit like every action) can be filtered for.
    expect(all.body.actions).toContain('run.signed');
    const signedRuns = await admin.get('/api/audit?action=run.signed');
    expect(signedRuns.status).toBe(200);
    expect(signedRuns.body.total ?? signedRuns.body.entries.length).toBeGreaterThan(0);

    const approved = await admin.get('/api/audit?action=revision.approved');
    expect(approved.body.entries.length).toBeGreaterThan(0);
    expect(approved.body.entries.every((e: { action: string }) => e.action === 'revision.approved')).toBe(
      true,
    );
    expect(approved.body.entries[0].actor.displayName).toBe('Marek Vos');

    const marekId = approved.body.entries[0].actor.id;
    const byMarek = await admin.get(`/api/audit?personId=${marekId}`);
    expect(byMarek.body.entries.every((e: { actor: { id: string } }) => e.actor.id === marekId)).toBe(true);

    const today = new Date().toISOString().slice(0, 10);
    expect(
      (await admin.get(`/api/audit?from=${today}&to=${today}&action=revision.submitted`)).body.total,
    ).toBeGreaterThan(0);
    expect((await admin.get('/api/audit?from=2001-01-01&to=2001-01-02')).body.total).toBe(0);

    const paged = await admin.get('/api/audit?pageSize=2&page=2');
    expect(paged.body.entries).toHaveLength(2);
    expect(paged.body.entries[0].id).toBe(all.body.entries[2].id);
  });

  it('bad filters get 400 naming the field; only admins may read the log', async () => {
    const admin = await t.as('admin');
    const bad = await admin.get('/api/audit?action=drop-tables&from=yesterday&pageSize=5000');
    expect(bad.status).toBe(400);
    expect(bad.body.fields.map((f: { field: string }) => f.field).sort()).toEqual([
      'query.action',
      'query.from',
      'query.pageSize',
    ]);
    expect((await admin.get('/api/audit?from=2026-02-02&to=2026-01-01')).body.fields[0].field).toBe(
      'query.from',
    );
    expect((await admin.get('/api/audit?sort=id')).status).toBe(400);
    expect((await (await t.as('marek')).get('/api/audit')).status).toBe(403);
  });
});

describe('the mail outbox page API and invitation mail', () => {
  it('an invitation mails the set-password link to the invitee; the outbox lists it for admins, link hidden', async () => {
    const admin = await t.as('admin');
    const res = await admin
      .post('/api/people/invitations')
      .send({ email: 'ada@tallowcreek.example', displayName: 'Ada Fenwick', roles: ['technician'] });
    expect(res.status).toBe(201);
    expect(JSON.stringify(res.body)).not.toContain('/set-password/');
    const token = await setPasswordTokenMailedTo(t.db, 'ada@tallowcreek.example');
    await deliverAll();
    const mail = (await parseMails(t.catcher!.received)).find((m) =>
      m.to.includes('ada@tallowcreek.example'),
    );
    expect(mail).toBeDefined();
    expect(mail!.subject).toBe('Your Benchwright account');
    expect(setPasswordToken(mail!)).toBe(token);

    const outbox = await admin.get('/api/mail/outbox');
    expect(outbox.status).toBe(200);
    const item = outbox.body.items.find((i: { reason: string }) => i.reason === 'invitation');
    expect(item).toMatchObject({
      to: ['ada@tallowcreek.example'],
      status: 'sent',
      attempts: 1,
      lastError: null,
    });
    expect(item.text).not.toContain(token);
    const pending = await admin.get('/api/mail/outbox?status=pending');
    expect(pending.body.items.every((i: { status: string }) => i.status === 'pending')).toBe(true);
    expect((await admin.get('/api/mail/outbox?status=lost')).status).toBe(400);
    expect((await (await t.as('marek')).get('/api/mail/outbox')).status).toBe(403);
  });
});
