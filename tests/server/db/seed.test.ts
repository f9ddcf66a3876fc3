import { eq, sql } from 'drizzle-orm';
import { inject } from 'vitest';
import { afterAll, describe, expect, it } from 'vitest';
import { dropDatabase } from '../../../server/bootstrap/postgres';
import { prepareDatabase } from '../../../server/bootstrap/prepare';
import { createDb, createPool } from '../../../server/db/client';
import { people } from '../../../server/db/schema';
import { readDemoPeople } from '../../../server/db/seed';

// Runs the very preparation `npm start` runs (migrations + demo content) twice on a fresh database.
const name = `bw_seed_${process.pid}`;
const { adminUrl, urlPrefix, appUrlPrefix, appPassword } = inject('testDb');
const cluster = {
  adminUrl,
  urlFor: (db: string) => urlPrefix + db,
  appUrlFor: (db: string) => appUrlPrefix + db,
  appPassword,
};
afterAll(() => dropDatabase(adminUrl, name));

describe('start-up preparation', () => {
  it('running it twice leaves exactly one copy of the demo content and keeps people’s changes', async () => {
    await dropDatabase(adminUrl, name);
    const url = await prepareDatabase(cluster, name);
    const pool = createPool(url);
    const db = createDb(pool);
    try {
      const demo = readDemoPeople();
      const count = async () => Number((await db.select({ n: sql<number>`count(*)` }).from(people))[0]!.n);
      expect(await count()).toBe(demo.length);
      await db
        .update(people)
        .set({ displayName: 'Renamed by an admin' })
        .where(eq(people.email, demo[1]!.email));

      await prepareDatabase(cluster, name);
      expect(await count()).toBe(demo.length);
      const [changed] = await db.select().from(people).where(eq(people.email, demo[1]!.email));
      expect(changed!.displayName).toBe('Renamed by an admin');
    } finally {
      await pool.end();
    }
  });
});
