// The test cluster (port 54339, .data/pg-test) and its template database, shared by the bootstrap
// and vitest's global setup. Each test file clones the template into a database of its own.
import { startCluster } from '../../server/bootstrap/postgres';
import { PORTS, prepareDatabase, projectRoot, say, testClusterName } from '../../server/bootstrap/prepare';
import { recreateDatabase } from '../../server/bootstrap/postgres';

export const TEMPLATE_DB = 'benchwright_template';

export function startTestCluster() {
  return startCluster({ name: testClusterName('test'), port: PORTS.testDb, projectRoot });
}

export async function prepareTestTemplate() {
  say(`starting the test PostgreSQL on 127.0.0.1:${PORTS.testDb}`);
  const cluster = startTestCluster();
  await recreateDatabase(cluster.adminUrl, TEMPLATE_DB);
  await prepareDatabase(cluster, TEMPLATE_DB);
  return { cluster };
}
