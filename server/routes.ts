import type { RouteDef } from './http/route';
import { attachmentRoutes } from './modules/attachments/attachments.routes';
import { authRoutes } from './modules/auth/auth.routes';
import { healthRoutes } from './modules/health/health.routes';
import { peopleRoutes } from './modules/people/people.routes';
import { procedureRoutes } from './modules/procedures/procedures.routes';

/** The one table of API routes; each declares who may call it. Mounted under /api. */
export const routeTable: readonly RouteDef[] = [
  ...healthRoutes,
  ...authRoutes,
  ...peopleRoutes,
  ...procedureRoutes,
  ...attachmentRoutes,
];
