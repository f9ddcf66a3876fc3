import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { revisions } from '../../../server/db/schema';
import { httpSession } from '../../support/http-session';
import { approveRevision } from '../../support/review-path';
import { startSecondServer } from '../../support/second-server';
import { createTestApp, demo, type TestApp } from '../../support/test-app';

// Server A runs in this process; server B is a separate Node process on the same database.
let a: TestApp;
let b: { url: string; stop: () => void } | undefined;
let bUrl = '';

beforeAll(async () => {
  a = await createTestApp({}, { search: true });
  b = await startSecondServer(a.databaseUrl);
  bUrl = b.url;
});
afterAll(async () => {
  b?.stop();
  await a?.close();
});

const meta = {
  title: 'TC-5R dial lamp and rectifier check',
  equipmentFamily: 'Table radio',
  equipmentModel: 'TC-5R',
  tags: ['rectifier'],
};

describe('two server processes on one database', () => {
  it('an approval made through server A is searchable on server B within a second', async () => {
    const hal = await a.as('hal');
    const created = await hal.post('/api/procedures').send(meta);
    const rev = created.body.revision;
    await hal.put(`/api/revisions/${rev.id}`).send({
      ...meta,
      params: { mainsNominal: 230, mainsVoltage: 230, mainsFrequency: 50 },
      lockVersion: 1,
      document: {
        type: 'doc',
        content: [
          {
            type: 'paragraph',
            content: [{ type: 'text', text: 'The gribbleton dial lamp flickers with the rectifier.' }],
          },
        ],
      },
    });
    const onB = httpSession(bUrl);
    expect((await onB.signIn(demo.tom.email, demo.tom.password)).status).toBe(200);
    expect((await onB.get('/api/search?q=gribbleton')).body.total).toBe(0);

    await approveRevision(a.db, rev.id);
    const approvedAt = Date.now();
    let total = 0;
    while (Date.now() - approvedAt < 1_000 && total === 0) {
      total = (await onB.get('/api/search?q=gribbleton')).body.total as number;
      if (!total) await new Promise((r) => setTimeout(r, 50));
    }
    const elapsed = Date.now() - approvedAt;
    console.log(`server B found the approval after ${elapsed} ms`);
    expect(total).toBe(1);
    expect(elapsed).toBeLessThan(1_000);
    // Server A's own index follows the same notification (it may land a moment after B's).
    const [row] = await a.db.select().from(revisions).where(eq(revisions.id, rev.id));
    await expect
      .poll(() => a.search!.index.has(row!.procedureId), { timeout: 1_000, interval: 50 })
      .toBe(true);
  });
});
