// Accounts: changing one's password, signing out everywhere, an admin-started reset whose link goes
// only to the person's mail, and authenticator codes (RFC 6238 TOTP) with single-use recovery codes,
// required for reviewers and admins once the shop turns it on.
import { and, eq, sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { matchTotp } from '../../../../server/auth/totp';
import { auditLog, people, recoveryCodes, session as sessionTable } from '../../../../server/db/schema';
import { parseMails, setPasswordToken } from '../../../support/parsed-mail';
import { createTestApp, demo, type TestApp } from '../../../support/test-app';
import { base32Decode, hotp, totpCode } from '../../../support/totp';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({}, { mail: true });
});
afterAll(() => t.close());

type Client = ReturnType<TestApp['client']>;
const idOf = async (email: string) =>
  (await t.db.select({ id: people.id }).from(people).where(eq(people.email, email)))[0]!.id;
const auditOf = (action: string, subject?: string) =>
  t.db
    .select()
    .from(auditLog)
    .where(
      subject ? and(eq(auditLog.action, action), eq(auditLog.subject, subject)) : eq(auditLog.action, action),
    );
const sessionsOf = async (personId: string) =>
  (
    await t.ownerDb
      .select({ n: sql<number>`count(*)::int` })
      .from(sessionTable)
      .where(sql`${sessionTable.sess}->'passport'->>'user' = ${personId}`)
  )[0]!.n;
/** The set-password token in the last message to `to` that carries one (waits for the mail to arrive). */
async function linkMailedTo(to: string, after = 0) {
  let token: string | undefined;
  await expect
    .poll(
      async () => {
        const mine = (await parseMails(t.catcher!.received.slice(after))).filter((m) => m.to.includes(to));
        token = mine.map(setPasswordToken).filter(Boolean).at(-1);
        return token;
      },
      { timeout: 5_000 },
    )
    .toBeTruthy();
  return token!;
}

describe('the one-time code check follows RFC 6238', () => {
  // RFC 6238 Appendix B, SHA-1 rows, secret "12345678901234567890" (ASCII). The vectors are 8-digit
  // codes; a 6-digit code is the same HOTP value modulo 10^6 (RFC 4226 §5.3), i.e. its last 6 digits.
  const secret = 'GEZDGNBVGY3TQOJQGEZDGNBVGY3TQOJQ'; // base32 of the ASCII secret (RFC 4648 §6)
  const vectors: [number, string][] = [
    [59, '94287082'],
    [1111111109, '07081804'],
    [1111111111, '14050471'],
    [1234567890, '89005924'],
    [2000000000, '69279037'],
    [20000000000, '65353130'],
  ];
  it.for(vectors)('T = %i s → %s', ([seconds, code]) => {
    expect(base32Decode(secret).toString('ascii')).toBe('12345678901234567890');
    // The test's own HOTP computation reproduces the published vector…
    expect(hotp(base32Decode(secret), Math.floor(seconds / 30), 8)).toBe(code);
    // …and the server accepts its last six digits in that time step, and not one step later.
    const step = Math.floor(seconds / 30);
    expect(matchTotp(secret, code.slice(-6), seconds * 1000)).toBe(step);
    expect(matchTotp(secret, code.slice(-6), (seconds + 90) * 1000)).toBeNull();
  });
});

describe('changing one’s password', () => {
  it('needs the current password; a wrong one changes nothing and is recorded', async () => {
    const sam = await t.as('sam');
    const wrong = await sam
      .post('/api/auth/password')
      .send({ currentPassword: 'not-sam-s-password', newPassword: 'valve rectifiers glow a dull orange' });
    expect(wrong.status).toBe(401);
    expect(wrong.body.fields[0].field).toBe('body.currentPassword');
    expect((await t.client().signIn(demo.sam.email, demo.sam.password)).status).toBe(200);
    expect((await auditOf('reauth.failed')).some((r) => r.subject === 'password change')).toBe(true);
    const common = await sam
      .post('/api/auth/password')
      .send({ currentPassword: demo.sam.password, newPassword: '1qaz2wsx3edc' });
    expect(common.status).toBe(400);
    expect(common.body.fields[0].field).toBe('body.newPassword');
  });

  it('ends every other session of that person, keeps this one (with a new id), and the old password stops working', async () => {
    const samId = await idOf(demo.sam.email);
    const here = await t.as('sam');
    const laptop = await t.as('sam');
    const tablet = await t.as('sam');
    const tom = await t.as('tom');
    const others = (await sessionsOf(samId)) - 1;
    expect(others).toBeGreaterThanOrEqual(2);
    const oldCsrf = here.csrf;
    const newPassword = 'choke input filters hum at twice the mains';
    const res = await here
      .post('/api/auth/password')
      .send({ currentPassword: demo.sam.password, newPassword });
    expect(res.status).toBe(200);
    expect(res.body.csrfToken).toBeTypeOf('string');
    expect(res.body.csrfToken).not.toBe(oldCsrf);
    expect((await laptop.get('/api/auth/me')).status).toBe(401);
    expect((await tablet.get('/api/auth/me')).status).toBe(401);
    expect((await tom.get('/api/auth/me')).status).toBe(200);
    expect(await sessionsOf(samId)).toBe(1);
    // This session goes on, and its writes work with the token from the answer.
    expect((await here.agent.get('/api/auth/me')).status).toBe(200);
    const write = await here.agent.post('/api/auth/sign-out').set('x-csrf-token', res.body.csrfToken);
    expect(write.status).toBe(200);
    expect((await t.client().signIn(demo.sam.email, demo.sam.password)).status).toBe(401);
    expect((await t.client().signIn(demo.sam.email, newPassword)).status).toBe(200);
    const audit = await auditOf('person.password-changed', demo.sam.email);
    expect(audit).toHaveLength(1);
    expect(audit[0]!.details).toMatchObject({ otherSessionsEnded: others });
    expect(JSON.stringify(audit)).not.toContain(newPassword);
  });
});

describe('signing out everywhere', () => {
  it('ends every session of that person, this one included; other people stay signed in', async () => {
    const priyaId = await idOf(demo.priya.email);
    const a = await t.as('priya');
    const b = await t.as('priya');
    const tom = await t.as('tom');
    const res = await a.post('/api/auth/sign-out-everywhere').send({});
    expect(res.status).toBe(200);
    expect(res.body.sessionsEnded).toBe(2);
    expect((await a.get('/api/auth/me')).status).toBe(401);
    expect((await b.get('/api/auth/me')).status).toBe(401);
    expect((await tom.get('/api/auth/me')).status).toBe(200);
    expect(await sessionsOf(priyaId)).toBe(0);
    expect(await auditOf('sign-out.everywhere', demo.priya.email)).toHaveLength(1);
  });
});

describe('links that set a password go by mail only', () => {
  it('the invite answer shows the admin no link; the invitee’s mail has it', async () => {
    const admin = await t.as('admin');
    const before = t.catcher!.received.length;
    const invite = await admin
      .post('/api/people/invitations')
      .send({ email: 'wren@tallowcreek.example', displayName: 'Wren Abbott', roles: ['technician'] });
    expect(invite.status).toBe(201);
    expect(JSON.stringify(invite.body)).not.toMatch(/set-password|token/i);
    expect(invite.body.mailedTo).toBe('wren@tallowcreek.example');
    const token = await linkMailedTo('wren@tallowcreek.example', before);
    const outbox = await admin.get('/api/mail/outbox');
    expect(JSON.stringify(outbox.body)).not.toContain(token);
    const newcomer = t.client();
    await newcomer.refreshToken();
    expect(
      (
        await newcomer
          .post('/api/auth/set-password')
          .send({ token, password: 'grid leak resistors drift with age' })
      ).status,
    ).toBe(200);
    expect(
      (await t.client().signIn('wren@tallowcreek.example', 'grid leak resistors drift with age')).status,
    ).toBe(200);
  });

  it('an admin-started reset mails the person a one-time link the admin never sees; using it ends their sessions', async () => {
    const admin = await t.as('admin');
    const ruthId = await idOf(demo.ruth.email);
    const ruthBefore = await t.as('ruth');
    const before = t.catcher!.received.length;
    const res = await admin.post(`/api/people/${ruthId}/password-reset`).send({});
    expect(res.status).toBe(202);
    expect(JSON.stringify(res.body)).not.toMatch(/set-password|token/i);
    expect(res.body.mailedTo).toBe(demo.ruth.email);
    const token = await linkMailedTo(demo.ruth.email, before);
    const withToken = (await parseMails(t.catcher!.received.slice(before))).filter(
      (m) => setPasswordToken(m) === token,
    );
    expect(withToken.map((m) => [m.to, m.envelopeTo, m.subject])).toEqual([
      [[demo.ruth.email], [demo.ruth.email], 'Choose a new Benchwright password'],
    ]);
    // The token appears once in the message: in the link.
    expect(withToken[0]!.text.split(token)).toHaveLength(2);
    expect(JSON.stringify((await admin.get('/api/mail/outbox')).body)).not.toContain(token);
    // Until the link is used, nothing changes: the old password still works.
    expect((await t.client().signIn(demo.ruth.email, demo.ruth.password)).status).toBe(200);
    const page = await t.client().get(`/api/auth/invitations/${token}`);
    expect(page.body).toMatchObject({ email: demo.ruth.email, purpose: 'reset' });
    const anon = t.client();
    await anon.refreshToken();
    const newPassword = 'mains transformers buzz when loose';
    expect((await anon.post('/api/auth/set-password').send({ token, password: newPassword })).status).toBe(
      200,
    );
    expect((await ruthBefore.get('/api/auth/me')).status).toBe(401);
    expect((await t.client().signIn(demo.ruth.email, demo.ruth.password)).status).toBe(401);
    expect((await t.client().signIn(demo.ruth.email, newPassword)).status).toBe(200);
    expect(await auditOf('person.password-reset-sent', demo.ruth.email)).toHaveLength(1);
    // A second link replaces the first: only the newest works.
    const first = t.catcher!.received.length;
    expect((await admin.post(`/api/people/${ruthId}/password-reset`).send({})).status).toBe(202);
    const older = await linkMailedTo(demo.ruth.email, first);
    const second = t.catcher!.received.length;
    expect((await admin.post(`/api/people/${ruthId}/password-reset`).send({})).status).toBe(202);
    const newer = await linkMailedTo(demo.ruth.email, second);
    expect((await t.client().get(`/api/auth/invitations/${older}`)).status).toBe(404);
    expect((await t.client().get(`/api/auth/invitations/${newer}`)).status).toBe(200);
  });

  it('only admins may start a reset (403), and a person who does not exist is 404', async () => {
    const tom = await t.as('tom');
    expect((await tom.post(`/api/people/${await idOf(demo.hal.email)}/password-reset`).send({})).status).toBe(
      403,
    );
    const admin = await t.as('admin');
    expect(
      (await admin.post('/api/people/00000000-0000-4000-8000-000000000000/password-reset').send({})).status,
    ).toBe(404);
  });
});

/** Sets up an authenticator for a signed-in client; returns its secret and recovery codes. */
async function enrol(c: Client, password: string) {
  const setup = await c.post('/api/auth/totp/setup').send({ password });
  expect(setup.status).toBe(200);
  const secret = setup.body.secret as string;
  expect(setup.body.otpauthUrl).toMatch(/^otpauth:\/\/totp\/.*secret=/);
  const confirm = await c.post('/api/auth/totp/confirm').send({ code: totpCode(secret) });
  expect(confirm.status).toBe(200);
  return { secret, recoveryCodes: confirm.body.recoveryCodes as string[] };
}

/** Password first; the answer asks for a code, and the session is not signed in yet. */
async function passwordStep(email: string, password: string) {
  const c = t.client();
  const res = await c.signIn(email, password);
  expect(res.status).toBe(200);
  expect(res.body).toMatchObject({ user: null, secondFactor: 'totp' });
  expect((await c.get('/api/auth/me')).status).toBe(401);
  return c;
}

describe('authenticator codes', () => {
  let halRecoveryCodes: string[] = []; // shown once, at set-up
  it('set-up needs the password and a right code; recovery codes are shown once and stored hashed', async () => {
    const hal = await t.as('hal');
    expect((await hal.post('/api/auth/totp/setup').send({ password: 'not-hal-s-password' })).status).toBe(
      401,
    );
    const setup = await hal.post('/api/auth/totp/setup').send({ password: demo.hal.password });
    expect(setup.status).toBe(200);
    const wrong = await hal
      .post('/api/auth/totp/confirm')
      .send({ code: totpCode(setup.body.secret, Date.now() + 10 * 60_000) });
    expect(wrong.status).toBe(400);
    expect(wrong.body.fields[0].field).toBe('body.code');
    expect((await hal.get('/api/auth/account')).body.secondFactor.enabled).toBe(false);
    const ok = await hal.post('/api/auth/totp/confirm').send({ code: totpCode(setup.body.secret) });
    expect(ok.status).toBe(200);
    const codes = ok.body.recoveryCodes as string[];
    halRecoveryCodes = codes;
    expect(codes).toHaveLength(10);
    expect(new Set(codes).size).toBe(10);
    const halId = await idOf(demo.hal.email);
    const stored = await t.db.select().from(recoveryCodes).where(eq(recoveryCodes.personId, halId));
    expect(stored).toHaveLength(10);
    const dump = JSON.stringify(stored);
    for (const code of codes) expect(dump).not.toContain(code.replace(/-/g, '').toUpperCase());
    for (const code of codes) expect(dump.toLowerCase()).not.toContain(code.toLowerCase());
    expect((await hal.get('/api/auth/account')).body.secondFactor).toMatchObject({
      enabled: true,
      recoveryCodesLeft: 10,
    });
    expect(await auditOf('person.second-factor-enabled', demo.hal.email)).toHaveLength(1);
  });

  it('signing in then takes the password and a code; a used code and a wrong one are refused; a recovery code works once', async () => {
    const halId = await idOf(demo.hal.email);
    const [secret] = (
      await t.db.select({ s: people.totpSecret }).from(people).where(eq(people.id, halId))
    ).map((r) => r.s!);
    // The code of the next time step (allowed for clock drift), since set-up used this one.
    const next = totpCode(secret!, Date.now() + 30_000);
    const wrongCode = await passwordStep(demo.hal.email, demo.hal.password);
    const bad = await wrongCode
      .post('/api/auth/sign-in/code')
      .send({ code: next === '000000' ? '111111' : '000000' });
    expect(bad.status).toBe(401);
    expect(bad.body.fields[0].field).toBe('body.code');
    expect((await wrongCode.get('/api/auth/me')).status).toBe(401);

    const c = await passwordStep(demo.hal.email, demo.hal.password);
    const ok = await c.post('/api/auth/sign-in/code').send({ code: next });
    expect(ok.status).toBe(200);
    expect(ok.body.user.email).toBe(demo.hal.email);
    expect((await c.get('/api/auth/me')).status).toBe(200);

    const replay = await passwordStep(demo.hal.email, demo.hal.password);
    expect((await replay.post('/api/auth/sign-in/code').send({ code: next })).status).toBe(401);

    const codes = await t.db.select().from(recoveryCodes).where(eq(recoveryCodes.personId, halId));
    expect(codes.every((x) => x.usedAt === null)).toBe(true);
    // A recovery code stands in for a lost authenticator, once.
    const viaRecovery = await passwordStep(demo.hal.email, demo.hal.password);
    const recovery = halRecoveryCodes[0]!;
    expect((await viaRecovery.post('/api/auth/sign-in/code').send({ code: recovery })).status).toBe(200);
    const reused = await passwordStep(demo.hal.email, demo.hal.password);
    expect((await reused.post('/api/auth/sign-in/code').send({ code: recovery })).status).toBe(401);
    const audit = await auditOf('sign-in', demo.hal.email);
    expect(audit.some((r) => r.details.secondFactor === 'recovery-code')).toBe(true);
  });

  it('a code without the password first is refused', async () => {
    const c = t.client();
    await c.refreshToken();
    const res = await c.post('/api/auth/sign-in/code').send({ code: '123456' });
    expect(res.status).toBe(401);
    expect(res.body.error).toMatch(/password first/);
  });

  it('8 parallel wrong codes check at most 5', async () => {
    const dee = await t.as('dee');
    await enrol(dee, demo.dee.password);
    const c = await passwordStep(demo.dee.email, demo.dee.password);
    const answers = await Promise.all(
      Array.from({ length: 8 }, (_, i) =>
        c.post('/api/auth/sign-in/code').send({ code: String(100000 + i * 7) }),
      ),
    );
    const statuses = answers.map((r) => r.status);
    expect(statuses.filter((s) => s !== 401 && s !== 429)).toEqual([]);
    expect(statuses.filter((s) => s === 401).length).toBeLessThanOrEqual(5);
    for (const r of answers.filter((x) => x.status === 429))
      expect(r.headers['retry-after']).toMatch(/^\d+$/);
  });
});

describe('the shop can require authenticator codes for reviewers and admins', () => {
  let adminRecoveryCodes: string[] = [];
  it('an admin turns it on only after setting up their own; reviewers without one can then do nothing but set one up; technicians are untouched', async () => {
    const admin = await t.as('admin');
    const refused = await admin.put('/api/settings/sign-in').send({ requireSecondFactor: true });
    expect(refused.status).toBe(409);
    expect(refused.body.error).toMatch(/your own/);
    const adminTotp = await enrol(admin, demo.admin.password);
    expect(adminTotp.recoveryCodes).toHaveLength(10);
    adminRecoveryCodes = adminTotp.recoveryCodes;
    const marek = await t.as('marek');
    const tom = await t.as('tom');
    expect((await marek.get('/api/review/queue')).status).toBe(200);

    const on = await admin.put('/api/settings/sign-in').send({ requireSecondFactor: true });
    expect(on.status).toBe(200);
    expect((await admin.get('/api/settings/sign-in')).body.requireSecondFactor).toBe(true);
    const changed = await auditOf('settings.changed');
    expect(changed.at(-1)!.details).toMatchObject({ requireSecondFactor: { from: false, to: true } });

    // Marek's session (he has none set up) now only reaches his account page.
    await new Promise((r) => setTimeout(r, 2_100)); // another process's cached setting would follow within 2 s
    const blocked = await marek.get('/api/review/queue');
    expect(blocked.status).toBe(403);
    expect(blocked.body.code).toBe('second-factor-enrolment');
    expect((await marek.get('/api/auth/session')).body.enrolmentRequired).toBe(true);
    expect((await tom.get('/api/runs')).status).toBe(200);
    const marekTotp = await enrol(marek, demo.marek.password);
    expect((await marek.get('/api/review/queue')).status).toBe(200);
    // Required: he cannot turn it off again.
    const off = await marek.post('/api/auth/totp/disable').send({ password: demo.marek.password });
    expect(off.status).toBe(409);
    expect(marekTotp.secret).toMatch(/^[A-Z2-7]+=*$/);

    expect((await tom.put('/api/settings/sign-in').send({ requireSecondFactor: false })).status).toBe(403);
    expect((await admin.put('/api/settings/sign-in').send({ requireSecondFactor: false })).status).toBe(200);
  });

  it('an admin can clear another person’s authenticator (lost phone and codes), not their own; it is audited', async () => {
    const admin = await passwordStep(demo.admin.email, demo.admin.password);
    expect((await admin.post('/api/auth/sign-in/code').send({ code: adminRecoveryCodes[0] })).status).toBe(
      200,
    );
    await admin.refreshToken(); // the signed-in session's token
    const deeId = await idOf(demo.dee.email);
    const res = await admin.post(`/api/people/${deeId}/second-factor-reset`).send({});
    expect(res.status).toBe(200);
    expect((await t.client().signIn(demo.dee.email, demo.dee.password)).body.user?.email).toBe(
      demo.dee.email,
    );
    expect(await auditOf('person.second-factor-reset', demo.dee.email)).toHaveLength(1);
    const self = await admin.post(`/api/people/${await idOf(demo.admin.email)}/second-factor-reset`).send({});
    expect(self.status).toBe(400);
  });
});
