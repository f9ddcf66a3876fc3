import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../../server/app';
import { PORTS, projectRoot, prepareDatabase, testClusterName } from '../../../../server/bootstrap/prepare';
import { startCluster, stopCluster, type Cluster } from '../../../../server/bootstrap/postgres';
import { createDb, createPool } from '../../../../server/db/client';
import { defaultConfig } from '../../../../server/deps';
import { createLogger } from '../../../../server/logger';
import { hashPassword } from '../../../../server/auth/passwords';
import { people } from '../../../../server/db/schema';

// A cluster of its own: this test stops and starts PostgreSQL under a running app.
let cluster: Cluster;
let pool: ReturnType<typeof createPool>;
let app: ReturnType<typeof createApp>;
const options = { name: testClusterName('health'), port: PORTS.healthDb, projectRoot };
const PERSON = { email: 'health.check@tallowcreek.example', password: 'mains hum through the night' };

beforeAll(async () => {
  cluster = startCluster(options);
  const url = await prepareDatabase(cluster, 'benchwright_health', { seed: false });
  pool = createPool(url);
  await createDb(pool)
    .insert(people)
    .values({
      email: PERSON.email,
      displayName: 'Health Check',
      roles: ['technician'],
      passwordHash: await hashPassword(PERSON.password),
    })
    .onConflictDoNothing();
  app = createApp({
    db: createDb(pool),
    pool,
    logger: createLogger('silent'),
    config: defaultConfig({ sessionSecret: 'x'.repeat(40) }),
  });
});
afterAll(async () => {
  await pool.end();
  stopCluster(cluster.dataDir);
});

async function waitForStatus(status: number, withinMs: number) {
  const deadline = Date.now() + withinMs;
  let last = 0;
  while (Date.now() < deadline) {
    last = (await request(app).get('/api/health')).status;
    if (last === status) return last;
    await new Promise((r) => setTimeout(r, 200));
  }
  return last;
}

describe('GET /api/health across a database restart', () => {
  it('answers 200, then 503 while PostgreSQL is stopped, then 200 again without restarting the app', async () => {
    expect((await request(app).get('/api/health')).status).toBe(200);
    const agent = request.agent(app);
    const token = (await agent.get('/api/auth/session')).body.csrfToken as string;
    expect(token).toBeTruthy();
    const signIn = await agent.post('/api/auth/sign-in').set('x-csrf-token', token).send(PERSON);
    expect(signIn.status).toBe(200);
    stopCluster(cluster.dataDir);
    const down = await request(app).get('/api/health');
    expect(down.status).toBe(503);
    expect(down.body.database).toBe('down');
    // Other routes that need the database degrade to 503 too, never 500 and never a crash.
    const other = await agent.get('/api/procedures');
    expect(other.status).toBe(503);
    expect(other.body.error).toMatch(/database is not reachable/);
    startCluster(options);
    expect(await waitForStatus(200, 5_000)).toBe(200);
  });
});
