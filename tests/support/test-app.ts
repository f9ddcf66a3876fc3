import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import request from 'supertest';
import { createApp } from '../../server/app';
import { createDb, createPool } from '../../server/db/client';
import { defaultConfig, type AppConfig } from '../../server/deps';
import { createLogger } from '../../server/logger';
import { startFakeSmtp } from '../../server/mail/fake-smtp';
import { MailSender } from '../../server/mail/sender';
import { SearchService } from '../../server/search/search-service';
import { fileStore } from '../../server/storage/files';
import { createTestBucket } from './test-bucket';
import { readDemoPeople } from '../../server/db/seed';
import { createTestDatabase } from './test-db';

export const demo = Object.fromEntries(
  readDemoPeople().map((p) => [
    p.email.split('@')[0]!,
    { email: p.email, password: p.password, roles: p.roles },
  ]),
) as Record<
  'admin' | 'hal' | 'ruth' | 'marek' | 'dee' | 'tom' | 'priya' | 'sam',
  { email: string; password: string; roles: string[] }
>;

/** The real Express app on a private, migrated and seeded database. */
export async function createTestApp(
  overrides: Partial<AppConfig> = {},
  options: { mail?: boolean; search?: boolean; files?: 'disk' | 's3' } = {},
) {
  const database = await createTestDatabase();
  const pool = createPool(database.url);
  const db = createDb(pool);
  // The owner's connection, for tests that act as a superuser would (around the triggers).
  const ownerPool = createPool(database.ownerUrl);
  const ownerDb = createDb(ownerPool);
  const uploadDir = mkdtempSync(path.join(tmpdir(), 'bw-uploads-'));
  const config = defaultConfig({
    sessionSecret: 'test-secret-'.padEnd(40, 'x'),
    publicUrl: 'http://127.0.0.1',
    uploadDir,
    ...overrides,
  });
  const logger = createLogger('silent');
  // With mail: a real SMTP conversation with the local catcher; flush() delivers what is due.
  const catcher = options.mail ? await startFakeSmtp(0) : undefined;
  if (catcher)
    config.smtp = { host: '127.0.0.1', port: catcher.port, from: 'Benchwright <bench@tallowcreek.example>' };
  const mailer = config.smtp ? new MailSender(db, config.smtp, logger) : undefined;
  const search = options.search ? new SearchService(db, database.url, logger) : undefined;
  await search?.start();
  // Files on disk in uploadDir, or in a bucket of this test file's own on the test object store.
  const bucket = options.files === 's3' ? await createTestBucket() : undefined;
  if (bucket) config.s3 = bucket.settings;
  const files = bucket?.store ?? fileStore(uploadDir);
  const app = createApp({ db, pool, logger, config, mailer, search, files });

  /** A cookie-keeping client; `signIn` leaves it signed in and remembers its CSRF token. */
  function client() {
    const agent = request.agent(app);
    let csrf = '';
    const withToken = <T extends request.Test>(t: T) => t.set('x-csrf-token', csrf);
    return {
      agent,
      get csrf() {
        return csrf;
      },
      async refreshToken() {
        const res = await agent.get('/api/auth/session');
        csrf = res.body.csrfToken;
        return res;
      },
      async signIn(email: string, password: string) {
        if (!csrf) await this.refreshToken();
        const res = await withToken(agent.post('/api/auth/sign-in')).send({ email, password });
        if (res.body.csrfToken) csrf = res.body.csrfToken;
        return res;
      },
      get: (url: string) => agent.get(url),
      post: (url: string) => withToken(agent.post(url)),
      patch: (url: string) => withToken(agent.patch(url)),
      put: (url: string) => withToken(agent.put(url)),
      delete: (url: string) => withToken(agent.delete(url)),
    };
  }

  async function as(who: keyof typeof demo) {
    const c = client();
    const res = await c.signIn(demo[who].email, demo[who].password);
    if (res.status !== 200)
      throw new Error(`sign-in as ${who} failed: ${res.status} ${JSON.stringify(res.body)}`);
    return c;
  }

  return {
    app,
    db,
    pool,
    mailer,
    catcher,
    search,
    ownerDb,
    databaseUrl: database.url,
    ownerUrl: database.ownerUrl,
    uploadDir,
    files,
    bucket,
    client,
    as,
    async close() {
      app.deps.auth.sessions.store.close();
      await mailer?.stop();
      await search?.stop();
      await catcher?.close();
      await pool.end();
      await ownerPool.end();
      await database.drop();
      await bucket?.drop();
      rmSync(uploadDir, { recursive: true, force: true });
    },
  };
}

export type TestApp = Awaited<ReturnType<typeof createTestApp>>;
