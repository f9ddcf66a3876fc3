import { randomBytes } from 'node:crypto';
import { inject } from 'vitest';
import { dropDatabase, revokeTemporary, withAdminClient } from '../../server/bootstrap/postgres';

/**
 * A private copy of the migrated, seeded template database for one test file: `url` connects as
 * the application role, as the app does; `ownerUrl` as the owner, for what only an owner may do.
 */
export async function createTestDatabase() {
  const { adminUrl, template, urlPrefix, appUrlPrefix } = inject('testDb');
  const name = `bw_t_${randomBytes(5).toString('hex')}`;
  for (let attempt = 0; ; attempt++) {
    try {
      await withAdminClient(adminUrl, (c) => c.query(`CREATE DATABASE "${name}" TEMPLATE "${template}"`));
      break;
    } catch (err) {
      // Two files cloning the template at the same instant can collide; try again shortly.
      if (attempt >= 10) throw err;
      await new Promise((r) => setTimeout(r, 150 + Math.random() * 300));
    }
  }
  // A clone does not inherit the template's database privileges.
  await revokeTemporary(adminUrl, name);
  return {
    name,
    url: appUrlPrefix + name,
    ownerUrl: urlPrefix + name,
    drop: () => dropDatabase(adminUrl, name),
  };
}
