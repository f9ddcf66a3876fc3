import type { RouteDef } from './http/route';
import { authRoutes } from './modules/auth/auth.routes';
import { healthRoutes } from './modules/health/health.routes';
import { peopleRoutes } from './modules/people/people.routes';

/** The one table of API routes; each declares who may call it. Mounted under /api. */
export const routeTable: readonly RouteDef[] = [...healthRoutes, ...authRoutes, ...peopleRoutes];
