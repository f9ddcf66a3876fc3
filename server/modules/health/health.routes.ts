import { defineRoute } from '../../http/route';
import { databaseReachable } from './health.service';

export const healthRoutes = [
  defineRoute({
    method: 'get',
    path: '/health',
    access: 'public',
    summary: 'Liveness and database reachability (503 while the database is away)',
    handler: async ({ res, deps }) => {
      if (await databaseReachable(deps.pool)) return { ok: true, database: 'up' };
      res.status(503);
      return { ok: false, database: 'down', error: 'The database is not reachable right now.' };
    },
  }),
];
