import { openApiRoute } from './http/openapi';
import { acknowledgementRoutes } from './modules/acknowledgements/acknowledgements.routes';
import { reviewDueRoutes } from './modules/review-due/review-due.routes';
import { homeRoutes } from './modules/home/home.routes';
import { followUpRoutes } from './modules/follow-ups/follow-ups.routes';
import type { RouteDef } from './http/route';
import { attachmentRoutes } from './modules/attachments/attachments.routes';
import { accountRoutes } from './modules/auth/account.routes';
import { authRoutes } from './modules/auth/auth.routes';
import { healthRoutes } from './modules/health/health.routes';
import { peopleRoutes } from './modules/people/people.routes';
import { procedureRoutes } from './modules/procedures/procedures.routes';
import { searchRoutes } from './modules/search/search.routes';
import { auditRoutes } from './modules/audit/audit.routes';
import { outboxRoutes } from './modules/mail/outbox.routes';
import { registerRoutes } from './modules/registers/registers.routes';
import { reviewRoutes } from './modules/review/review.routes';
import { runDecisionRoutes } from './modules/runs/run-decisions.routes';
import { runRoutes } from './modules/runs/runs.routes';
import { paperSheetRoutes } from './modules/paper-sheets/paper-sheets.routes';
import { unitRoutes } from './modules/units/units.routes';

/** The one table of API routes; each declares who may call it. Mounted under /api. */
export const routeTable: readonly RouteDef[] = [
  ...healthRoutes,
  ...authRoutes,
  ...accountRoutes,
  ...peopleRoutes,
  ...procedureRoutes,
  ...attachmentRoutes,
  ...searchRoutes,
  ...reviewRoutes,
  ...acknowledgementRoutes,
  ...reviewDueRoutes,
  ...homeRoutes,
  ...auditRoutes,
  ...outboxRoutes,
  ...unitRoutes,
  ...runDecisionRoutes,
  ...runRoutes,
  ...paperSheetRoutes,
  ...registerRoutes,
  ...followUpRoutes,
  openApiRoute(() => routeTable),
];
