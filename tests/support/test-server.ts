import { testClientDir } from '../../server/bootstrap/prepare';
import { startServer } from '../../server/index';
import { createLogger } from '../../server/logger';
import { createTestDatabase } from './test-db';

/** The built app (dist/client + API) listening on a free loopback port, on a private database. */
export async function startTestServer() {
  const database = await createTestDatabase();
  const running = await startServer({
    databaseUrl: database.url,
    port: 0,
    logger: createLogger('silent'),
    config: { sessionSecret: 'e2e-secret-'.padEnd(40, 'x'), clientDir: testClientDir },
  });
  return {
    url: running.url,
    async close() {
      await running.close();
      await database.drop();
    },
  };
}
