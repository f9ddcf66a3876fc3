import { randomBytes, randomUUID } from 'node:crypto';
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { people, signatures } from '../../../server/db/schema';
import { routeTable } from '../../../server/routes';
import { createTestApp, demo, type TestApp } from '../../support/test-app';
import { ACTORS, MATRIX, type Actor, type MatrixRow, type Target } from './authorization-matrix.table';
import { approve, inReview, newDraft } from '../modules/review/review-support';
import { benchProcedure, entry, newUnit, personId, startRun } from '../modules/runs/runs-fixtures';
import { setPasswordTokenMailedTo } from '../../support/mailed-link';

type Client = ReturnType<TestApp['client']>;

let t: TestApp;
let targets: Record<Target, string>;
const clients = new Map<Actor, Client>();
const WHO = { technician: 'tom', author: 'hal', reviewer: 'marek', admin: 'admin' } as const;

beforeAll(async () => {
  t = await createTestApp({}, { search: true });
  const tom = await t.as('tom');
  const approved = await benchProcedure(t, 'approved', 'Matrix: TC-18 HT winding check');
  const underReview = await benchProcedure(t, 'in_review', 'Matrix: TC-18 heater check');
  const [signature] = await t.db
    .select({ id: signatures.id })
    .from(signatures)
    .where(eq(signatures.meaning, 'approved'))
    .limit(1);
  const unit = await newUnit(tom);
  const run = await startRun(tom, approved.id, unit.id);
  expect(run.status).toBe(201);
  targets = {
    approvedProcedure: approved.procedureId,
    approvedRevision: approved.id,
    inReviewRevision: underReview.id,
    approvalSignature: signature!.id,
    unit: unit.id,
    run: run.body.run.id,
    runStep: 'rd-heater',
    randomId: randomUUID(),
    randomToken: randomBytes(32).toString('base64url'),
  };
  for (const actor of ACTORS) clients.set(actor, await clientFor(actor));
});
afterAll(() => t.close());

/** Anonymous callers fetch the CSRF token first, so a refused write is the access decision, not CSRF. */
async function clientFor(actor: Actor) {
  if (actor !== 'anonymous') return t.as(WHO[actor]);
  const c = t.client();
  await c.refreshToken();
  return c;
}

async function probe(row: MatrixRow, c: Client) {
  const url =
    '/api' +
    row.path.replace(/:(\w+)/g, (_m, name: string) => encodeURIComponent(targets[row.probe.params![name]!]));
  if (row.method === 'get') return c.get(url).query(row.probe.query ?? {});
  return c[row.method](url)
    .query(row.probe.query ?? {})
    .send(row.probe.body ?? {});
}

const key = (method: string, path: string) => `${method.toUpperCase()} ${path}`;

describe('the authorization matrix', () => {
  it('lists every route in the route table, and only those', () => {
    const listed = MATRIX.map((r) => key(r.method, r.path));
    const mounted = routeTable.map((r) => key(r.method, r.path));
    expect(new Set(listed).size, 'a route is listed twice').toBe(listed.length);
    expect(
      mounted.filter((k) => !listed.includes(k)),
      'routes missing from the matrix',
    ).toEqual([]);
    expect(
      listed.filter((k) => !mounted.includes(k)),
      'matrix rows for routes that no longer exist',
    ).toEqual([]);
  });

  it.for(MATRIX.map((row) => [key(row.method, row.path), row] as const))('%s', async ([, row]) => {
    const got: Partial<Record<Actor, string>> = {};
    const want: Partial<Record<Actor, string>> = {};
    for (const actor of ACTORS) {
      const c = row.probe.freshSession ? await clientFor(actor) : clients.get(actor)!;
      const res = await probe(row, c);
      got[actor] = String(res.status);
      want[actor] = String(row.expect[actor]);
      if (res.status >= 400)
        expect(typeof res.body.error, `${actor}: a ${res.status} says why`).toBe('string');
      if (res.status !== row.expect[actor]) got[actor] += ` ${JSON.stringify(res.body).slice(0, 120)}`;
    }
    if (row.probe.endsEverySession) for (const actor of ACTORS) clients.set(actor, await clientFor(actor));
    expect(got).toEqual(want);
  });
});

describe('object-level checks', () => {
  it('a technician sees neither a draft revision, its procedure, nor its signatures (404); an author does', async () => {
    const tom = clients.get('technician')!;
    const hal = clients.get('author')!;
    const draft = await benchProcedure(t, 'draft', 'Matrix: unpublished draft');
    expect((await tom.get(`/api/revisions/${draft.id}`)).status).toBe(404);
    expect((await tom.get(`/api/procedures/${draft.procedureId}`)).status).toBe(404);
    expect((await tom.get(`/api/revisions/${draft.id}/signatures`)).status).toBe(404);
    expect((await tom.get('/api/procedures')).body.procedures.map((p: { id: string }) => p.id)).not.toContain(
      draft.procedureId,
    );
    expect((await hal.get(`/api/revisions/${draft.id}`)).status).toBe(200);
  });

  it('a technician cannot open the signature on a returned revision; the reviewer can', async () => {
    const r = await inReview(t, 'ruth');
    const marek = clients.get('reviewer')!;
    const returned = await marek
      .post(`/api/revisions/${r.revision.id}/return`)
      .send({ password: demo.marek.password, comment: 'Add the standby switch check.' });
    expect(returned.status).toBe(200);
    const signatureId = returned.body.signature.id as string;
    expect((await clients.get('technician')!.get(`/api/signatures/${signatureId}/verify`)).status).toBe(404);
    expect((await clients.get('technician')!.get(`/api/revisions/${r.revision.id}/signatures`)).status).toBe(
      404,
    );
    expect((await marek.get(`/api/signatures/${signatureId}/verify`)).status).toBe(200);
  });

  it('a reviewer cannot approve their own revision (403), and no signature is written', async () => {
    const r = await inReview(t, 'dee');
    const dee = await t.as('dee');
    const res = await approve(dee, r.revision.id, 'dee');
    expect(res.status).toBe(403);
    expect(await t.db.select().from(signatures).where(eq(signatures.revisionId, r.revision.id))).toEqual([]);
  });

  it('an author or technician cannot change anyone’s roles, their own included (403); nothing changes', async () => {
    const tomId = await personId(t, 'tom');
    const halId = await personId(t, 'hal');
    expect(
      (
        await clients
          .get('author')!
          .patch(`/api/people/${tomId}`)
          .send({ roles: ['admin'] })
      ).status,
    ).toBe(403);
    expect(
      (
        await clients
          .get('author')!
          .patch(`/api/people/${halId}`)
          .send({ roles: ['author', 'reviewer', 'admin'] })
      ).status,
    ).toBe(403);
    expect(
      (
        await clients
          .get('technician')!
          .patch(`/api/people/${tomId}`)
          .send({ roles: ['technician', 'admin'] })
      ).status,
    ).toBe(403);
    expect(
      (
        await clients
          .get('reviewer')!
          .patch(`/api/people/${halId}`)
          .send({ roles: ['reviewer'] })
      ).status,
    ).toBe(403);
    const rows = await t.db.select({ email: people.email, roles: people.roles }).from(people);
    expect(rows.find((p) => p.email === demo.tom.email)!.roles).toEqual(['technician']);
    expect(rows.find((p) => p.email === demo.hal.email)!.roles).toEqual(['author']);
  });

  it('only the run’s performer signs its sheet; after a recorded handover the new performer signs, and the sheet names both', async () => {
    const tom = clients.get('technician')!;
    const unit = await newUnit(tom);
    const run = (await startRun(tom, targets.approvedRevision, unit.id)).body.run;
    for (const [step, body] of [
      ['hz-ht-live', { done: true }],
      ['rd-ht-ac', { value: '251 V' }],
      ['rd-heater', { value: '6.3 V' }],
      ['ck-discharge', { done: true }],
    ] as const)
      expect((await entry(tom, run.id, step, body)).status).toBe(200);
    const priya = await t.as('priya');
    expect(
      (await priya.post(`/api/runs/${run.id}/sign`).send({ password: demo.priya.password })).status,
    ).toBe(403);
    const priyaId = (await priya.get('/api/auth/session')).body.user.id;
    expect(
      (
        await tom
          .post(`/api/runs/${run.id}/handover`)
          .send({ to: priyaId, reason: 'Priya signs off the bench today.' })
      ).status,
    ).toBe(200);
    expect((await tom.post(`/api/runs/${run.id}/sign`).send({ password: demo.tom.password })).status).toBe(
      403,
    );
    const signed = await priya.post(`/api/runs/${run.id}/sign`).send({ password: demo.priya.password });
    expect(signed.status).toBe(200);
    expect(signed.body.run.startedBy.displayName).toBe('Tom Achterberg');
    expect(signed.body.run.handovers).toMatchObject([
      { from: { displayName: 'Tom Achterberg' }, to: { displayName: 'Priya Lindqvist' } },
    ]);
    expect(signed.body.run.signature).toMatchObject({
      signer: { displayName: 'Priya Lindqvist' },
      signerRole: 'technician',
      meaning: 'performed',
      verified: true,
    });
    // An author cannot sign a run sheet at all.
    expect(
      (await clients.get('author')!.post(`/api/runs/${run.id}/sign`).send({ password: demo.hal.password }))
        .status,
    ).toBe(403);
  });
});

describe('fields a caller may not set', () => {
  it('bodies carrying role, roles, state, within or expected where they do not belong get 400', async () => {
    const tom = clients.get('technician')!;
    const hal = clients.get('author')!;
    const marek = clients.get('reviewer')!;
    const admin = clients.get('admin')!;
    const d = await newDraft(t, 'hal');
    const meta = {
      title: 'Matrix: over-posting',
      equipmentFamily: 'Guitar amplifier',
      equipmentModel: 'TC-18',
      tags: [],
    };
    const params = { mainsNominal: 230, mainsVoltage: 230, mainsFrequency: 50 };
    const tomId = await personId(t, 'tom');
    const anon = t.client();
    await anon.refreshToken();
    const cases: [string, Promise<{ status: number; body: { fields?: { field: string }[] } }>][] = [
      [
        'create a procedure already approved',
        hal.post('/api/procedures').send({ ...meta, state: 'approved' }),
      ],
      [
        'save a draft as approved',
        hal.put(`/api/revisions/${d.revision.id}`).send({
          ...d.meta,
          params,
          lockVersion: d.revision.lockVersion,
          document: { type: 'doc', content: [] },
          state: 'approved',
        }),
      ],
      [
        'submit straight to approved',
        hal.post(`/api/revisions/${d.revision.id}/submit`).send({ state: 'approved' }),
      ],
      [
        'approve with a role claim',
        marek
          .post(`/api/revisions/${targets.inReviewRevision}/approve`)
          .send({ password: demo.marek.password, role: 'admin' }),
      ],
      [
        'a reading marked within by the client',
        entry(tom, targets.run, 'rd-heater', { value: '9 V', within: true }),
      ],
      [
        'a reading with the client’s expected value',
        entry(tom, targets.run, 'rd-heater', { value: '9 V', expected: 9 }),
      ],
      [
        'a unit carrying roles',
        tom.post('/api/units').send({ model: 'TC-18', serial: 'OVERPOST-1', roles: ['admin'] }),
      ],
      [
        'a run with a state',
        tom.post('/api/runs').send({
          revisionId: targets.approvedRevision,
          unitId: targets.unit,
          mainsVoltage: 230,
          mainsFrequency: 50,
          state: 'signed',
        }),
      ],
      ['a person patched with role (singular)', admin.patch(`/api/people/${tomId}`).send({ role: 'admin' })],
      [
        'an invitation with a state',
        admin.post('/api/people/invitations').send({
          email: 'overpost@tallowcreek.example',
          displayName: 'Over Post',
          roles: ['technician'],
          state: 'active',
        }),
      ],
      [
        'a sign-in claiming roles',
        anon
          .post('/api/auth/sign-in')
          .send({ email: demo.tom.email, password: demo.tom.password, roles: ['admin'] }),
      ],
    ];
    const results: Record<string, number> = {};
    for (const [name, pending] of cases) results[name] = (await pending).status;
    expect(results).toEqual(Object.fromEntries(cases.map(([name]) => [name, 400])));
    // Nothing was created or changed by the refused bodies.
    expect((await admin.get('/api/people')).body.people.map((p: { email: string }) => p.email)).not.toContain(
      'overpost@tallowcreek.example',
    );
    expect(
      (await tom.get(`/api/runs/${targets.run}`)).body.run.entries.find(
        (e: { stepId: string }) => e.stepId === 'rd-heater',
      ),
    ).toBeUndefined();
  });

  it('a set-password link carrying roles is refused (400) and stays unused; without them it works and grants only the invited role', async () => {
    const admin = clients.get('admin')!;
    const invite = await admin
      .post('/api/people/invitations')
      .send({ email: 'fresh.tech@tallowcreek.example', displayName: 'Fresh Tech', roles: ['technician'] });
    expect(invite.status).toBe(201);
    // The link goes to the invitee's mail only (queued in the outbox), never into the admin's answer.
    expect(JSON.stringify(invite.body)).not.toContain('/set-password/');
    const token = await setPasswordTokenMailedTo(t.db, 'fresh.tech@tallowcreek.example');
    const anon = t.client();
    await anon.refreshToken();
    const password = 'coupling capacitor drift at dawn';
    expect(
      (await anon.post('/api/auth/set-password').send({ token, password, roles: ['admin'] })).status,
    ).toBe(400);
    expect((await anon.post('/api/auth/set-password').send({ token, password })).status).toBe(200);
    const signedIn = await t.client().signIn('fresh.tech@tallowcreek.example', password);
    expect(signedIn.status).toBe(200);
    expect(signedIn.body.user.roles).toEqual(['technician']);
  });
});
