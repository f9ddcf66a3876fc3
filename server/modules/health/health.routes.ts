import { defineRoute } from '../../http/route';

export const healthRoutes = [
  defineRoute({
    method: 'get',
    path: '/health',
    access: 'public',
    summary: 'Liveness and database reachability (503 while the database is away)',
    handler: async ({ res, deps }) => {
      try {
        await deps.pool.query('SELECT 1');
        return { ok: true, database: 'up' };
      } catch {
        res.status(503);
        return { ok: false, database: 'down', error: 'The database is not reachable right now.' };
      }
    },
  }),
];
