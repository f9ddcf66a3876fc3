import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { Writable } from 'node:stream';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app';
import { createDb, createPool } from '../../server/db/client';
import { defaultConfig } from '../../server/deps';
import { createLogger } from '../../server/logger';
import { demo } from '../support/test-app';
import { createTestDatabase } from '../support/test-db';
import { setPasswordTokenMailedTo } from '../support/mailed-link';

// The app as it runs, logging at 'debug' (a line for every request, reads too) into memory instead of stdout.
let output = '';
const sink = new Writable({
  write(chunk, _encoding, done) {
    output += chunk.toString();
    done();
  },
});
let database: Awaited<ReturnType<typeof createTestDatabase>>;
let pool: ReturnType<typeof createPool>;
let app: ReturnType<typeof createApp>;
let uploadDir: string;

beforeAll(async () => {
  database = await createTestDatabase();
  pool = createPool(database.url);
  uploadDir = mkdtempSync(path.join(tmpdir(), 'bw-log-uploads-'));
  const config = defaultConfig({
    sessionSecret: 'logging-test-'.padEnd(40, 'x'),
    publicUrl: 'http://127.0.0.1',
    uploadDir,
  });
  app = createApp({ db: createDb(pool), pool, logger: createLogger('debug', sink), config });
});
afterAll(async () => {
  app.deps.auth.sessions.store.close();
  await pool.end();
  await database.drop();
  rmSync(uploadDir, { recursive: true, force: true });
});

/** A session kept by hand, so every secret it receives can be searched for in the log. */
function session() {
  const agent = request.agent(app);
  const secrets: string[] = [];
  let csrf = '';
  const keep = (res: request.Response) => {
    for (const c of (res.headers['set-cookie'] as unknown as string[] | undefined) ?? []) {
      const value = c.split(';')[0]!.split('=')[1]!;
      const decoded = decodeURIComponent(value); // s:<id>.<signature>
      secrets.push(value, decoded, decoded.slice(2).split('.')[0]!);
    }
    if (typeof res.body?.csrfToken === 'string') {
      csrf = res.body.csrfToken;
      secrets.push(csrf);
    }
    return res;
  };
  return {
    secrets,
    get: async (url: string) => keep(await agent.get(url)),
    post: async (url: string, body: object = {}) =>
      keep(await agent.post(url).set('X-CSRF-Token', csrf).send(body)),
    async signIn(email: string, password: string) {
      await this.get('/api/auth/session');
      return this.post('/api/auth/sign-in', { email, password });
    },
  };
}

const FORGED = 'x\n{"level":50,"msg":"forged"}@example.com';

describe('what reaches the log', () => {
  it('holds no password, session cookie, CSRF token, set-password token or hash detail; and no line can be forged', async () => {
    const secrets: string[] = [demo.admin.password];
    const admin = session();
    expect((await admin.signIn(demo.admin.email, demo.admin.password)).status).toBe(200);
    // A write carrying the CSRF header: an invitation, whose link holds a one-time token.
    const invite = await admin.post('/api/people/invitations', {
      email: 'log.check@tallowcreek.example',
      displayName: 'Log Check',
      roles: ['technician'],
    });
    expect(invite.status).toBe(201);
    const inviteToken = await setPasswordTokenMailedTo(createDb(pool), 'log.check@tallowcreek.example');
    // The invitee opens the link itself: the app shell is served for it, and its token must not be logged.
    await request(app).get(`/set-password/${inviteToken}`);
    await request(app).get(`/API/Auth/Invitations/${inviteToken}`); // Express routes paths in any case
    const newPassword = 'valve heaters glow amber at dusk';
    const invitee = session();
    await invitee.get('/api/auth/session');
    expect(
      (await invitee.post('/api/auth/set-password', { token: inviteToken, password: newPassword })).status,
    ).toBe(200);
    expect((await invitee.signIn('log.check@tallowcreek.example', newPassword + ' wrong')).status).toBe(401);
    expect((await invitee.signIn('log.check@tallowcreek.example', newPassword)).status).toBe(200);
    expect((await invitee.post('/api/units', { model: 'TC-18', serial: 'LOG-001' })).status).toBe(201);
    expect((await invitee.post('/api/auth/sign-out')).status).toBe(200);
    expect((await admin.post('/api/auth/sign-out')).status).toBe(200);
    secrets.push(inviteToken, newPassword, newPassword + ' wrong', ...admin.secrets, ...invitee.secrets);

    // Attempts to forge a line: a newline in the e-mail at sign-in and in an invitation, and in a URL.
    const attacker = session();
    expect((await attacker.signIn(FORGED, 'whatever passphrase')).status).toBe(401);
    expect((await attacker.signIn(FORGED.replace('\n', '\r\n'), 'whatever passphrase')).status).toBe(401);
    const admin2 = session();
    await admin2.signIn(demo.admin.email, demo.admin.password);
    expect(
      (
        await admin2.post('/api/people/invitations', {
          email: FORGED,
          displayName: 'x\n{"level":50,"msg":"forged"}',
          roles: ['technician'],
        })
      ).status,
    ).toBe(400);
    await attacker.get('/api/auth/invitations/' + encodeURIComponent(FORGED.padEnd(30, 'x')));

    const lines = output.split('\n').filter((l) => l.length > 0);
    // The log did record this traffic (so the absence checks below mean something).
    expect(lines.length).toBeGreaterThan(15);
    const parsed = lines.map((line) => {
      const value: unknown = JSON.parse(line);
      expect(value !== null && typeof value === 'object' && !Array.isArray(value), line.slice(0, 120)).toBe(
        true,
      );
      return value as { msg?: string; req?: { url?: string; headers?: Record<string, string> } };
    });
    expect(parsed.filter((p) => p.msg === 'forged')).toEqual([]);
    expect(parsed.some((p) => p.msg === 'sign-in refused')).toBe(true);
    // Each request is logged by id, method, path and status; headers (cookie, CSRF token) never are.
    expect(parsed.some((p) => p.req?.url === '/api/people/invitations')).toBe(true);
    expect(parsed.filter((p) => p.req && 'headers' in p.req)).toEqual([]);
    // A one-time link's token in a path is replaced before the line is written.
    expect(parsed.some((p) => p.req?.url?.startsWith('/api/auth/invitations/[redacted]'))).toBe(true);
    expect(parsed.some((p) => p.req?.url === '/set-password/[redacted]')).toBe(true);

    for (const secret of new Set(secrets.filter((s) => s.length >= 8))) {
      expect(output.includes(secret), `the log contains a secret (${secret.slice(0, 6)}…)`).toBe(false);
    }
    expect(output).not.toMatch(/argon2/i);
  });
});
