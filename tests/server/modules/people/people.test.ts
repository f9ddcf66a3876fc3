import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, demo, type TestApp } from '../../../support/test-app';
import { setPasswordTokenMailedTo } from '../../../support/mailed-link';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

describe('people administration', () => {
  it('anonymous gets 401 and a technician gets 403 from an admin route, as JSON with a message', async () => {
    const anon = await t.client().get('/api/people');
    expect(anon.status).toBe(401);
    expect(anon.body.error).toMatch(/Sign in/);
    const tech = await (await t.as('tom')).get('/api/people');
    expect(tech.status).toBe(403);
    expect(tech.body.error).toMatch(/admin/);
  });

  it('lists the seeded demo people for every role', async () => {
    const res = await (await t.as('admin')).get('/api/people');
    expect(res.status).toBe(200);
    const roles = new Set(res.body.people.flatMap((p: { roles: string[] }) => p.roles));
    expect([...roles].sort()).toEqual(['admin', 'author', 'reviewer', 'technician']);
  });

  it('invites a person, who sets a password from the one-time link and signs in', async () => {
    const admin = await t.as('admin');
    const invite = await admin.post('/api/people/invitations').send({
      email: 'Nell@TallowCreek.example',
      displayName: 'Nell Harrow',
      roles: ['technician', 'author'],
    });
    expect(invite.status).toBe(201);
    expect(invite.body.person).toMatchObject({ email: 'nell@tallowcreek.example', hasPassword: false });
    expect(JSON.stringify(invite.body)).not.toContain('/set-password/');
    const token = await setPasswordTokenMailedTo(t.db, 'nell@tallowcreek.example');

    const newcomer = t.client();
    expect((await newcomer.get(`/api/auth/invitations/${token}`)).body.displayName).toBe('Nell Harrow');
    await newcomer.refreshToken();
    const short = await newcomer.post('/api/auth/set-password').send({ token, password: 'short' });
    expect(short.status).toBe(400);
    expect(short.body.fields[0].field).toBe('body.password');
    // A common password is refused even when long enough (ASVS 6.2.4).
    const common = await newcomer.post('/api/auth/set-password').send({ token, password: '1qaz2wsx3edc' });
    expect(common.status).toBe(400);
    expect(common.body.fields[0]).toEqual({
      field: 'body.password',
      reason: 'is one of the most common passwords',
    });
    const passphrase = 'copper wound chokes hum at one hundred hertz';
    expect((await newcomer.post('/api/auth/set-password').send({ token, password: passphrase })).status).toBe(
      200,
    );
    // The link works once.
    expect(
      (await newcomer.post('/api/auth/set-password').send({ token, password: passphrase + '!' })).status,
    ).toBe(404);
    const signIn = await t.client().signIn('nell@tallowcreek.example', passphrase);
    expect(signIn.status).toBe(200);
    expect(signIn.body.user.roles).toEqual(['technician', 'author']);
  });

  it('refuses a duplicate invitation with the field named', async () => {
    const admin = await t.as('admin');
    const res = await admin
      .post('/api/people/invitations')
      .send({ email: demo.tom.email, displayName: 'Tom again', roles: ['technician'] });
    expect(res.status).toBe(409);
    expect(res.body.fields[0].field).toBe('body.email');
  });

  it('rejects an unknown role and unknown fields with 400', async () => {
    const admin = await t.as('admin');
    const people = (await admin.get('/api/people')).body.people as { id: string; email: string }[];
    const tom = people.find((p) => p.email === demo.tom.email)!;
    const bad = await admin.patch(`/api/people/${tom.id}`).send({ roles: ['wizard'] });
    expect(bad.status).toBe(400);
    expect(bad.body.fields[0].field).toMatch(/^body\.roles/);
    const extra = await admin.patch(`/api/people/${tom.id}`).send({ passwordHash: 'x' });
    expect(extra.status).toBe(400);
    const badId = await admin.patch('/api/people/not-a-uuid').send({ active: false });
    expect(badId.status).toBe(400);
    expect(badId.body.fields[0].field).toBe('params.id');
  });

  it('a role change takes effect on the next request', async () => {
    const admin = await t.as('admin');
    const priya = await t.as('priya');
    expect((await priya.get('/api/people')).status).toBe(403);
    const id = (await priya.get('/api/auth/session')).body.user.id;
    expect((await admin.patch(`/api/people/${id}`).send({ roles: ['technician', 'admin'] })).status).toBe(
      200,
    );
    expect((await priya.get('/api/people')).status).toBe(200);
    expect((await admin.patch(`/api/people/${id}`).send({ roles: ['technician'] })).status).toBe(200);
    expect((await priya.get('/api/people')).status).toBe(403);
  });

  it('deactivating a person ends their existing session at once (401), and they cannot sign in', async () => {
    const admin = await t.as('admin');
    const sam = await t.as('sam');
    const id = (await sam.get('/api/auth/session')).body.user.id;
    expect((await admin.patch(`/api/people/${id}`).send({ active: false })).status).toBe(200);
    const after = await sam.get('/api/auth/me');
    expect(after.status).toBe(401);
    expect(after.body.error).toMatch(/Sign in/);
    expect((await t.client().signIn(demo.sam.email, demo.sam.password)).status).toBe(401);
    expect((await admin.patch(`/api/people/${id}`).send({ active: true })).status).toBe(200);
    expect((await t.client().signIn(demo.sam.email, demo.sam.password)).status).toBe(200);
  });

  it('an admin cannot deactivate themselves or drop their own admin role', async () => {
    const admin = await t.as('admin');
    const id = (await admin.get('/api/auth/session')).body.user.id;
    const res = await admin.patch(`/api/people/${id}`).send({ active: false });
    expect(res.status).toBe(400);
    expect(res.body.error).toMatch(/yourself/);
  });
});
