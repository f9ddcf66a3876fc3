import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { testClientDir } from '../../server/bootstrap/prepare';
import { startServer } from '../../server/index';
import { createLogger } from '../../server/logger';
import { createTestDatabase } from './test-db';

/** The built app (dist/client + API) listening on a free loopback port, on a private database. */
export async function startTestServer() {
  const database = await createTestDatabase();
  const uploadDir = mkdtempSync(path.join(tmpdir(), 'bw-e2e-uploads-'));
  const running = await startServer({
    databaseUrl: database.url,
    port: 0,
    logger: createLogger('silent'),
    config: { sessionSecret: 'e2e-secret-'.padEnd(40, 'x'), clientDir: testClientDir, uploadDir },
  });
  return {
    url: running.url,
    databaseUrl: database.url,
    uploadDir,
    async close() {
      await running.close();
      await database.drop();
      rmSync(uploadDir, { recursive: true, force: true });
    },
  };
}
