import type { ComponentType } from 'react';
import {
  createBrowserRouter,
  RouterProvider,
  type LoaderFunctionArgs,
  type RouteObject,
} from 'react-router-dom';
import type { FetchQueryOptions } from '@tanstack/react-query';
import { paths } from '@/config/paths';
import { AppLayout } from '@/components/layouts/app-layout';
import { RouteError, type WayBack } from './routes/route-error';
import { markNavigation, queryClient } from '@/lib/query-client';
import { accountQueryOptions } from '@/features/account/api/account';
import { auditLogQueryOptions } from '@/features/audit/api/get-audit';
import { sessionQueryOptions } from '@/features/auth/api/get-session';
import { invitationQueryOptions } from '@/features/auth/api/set-password';
import { homeQueryOptions } from '@/features/home/api/get-home';
import { followUpsQueryOptions } from '@/features/follow-ups/api/follow-ups';
import { outboxQueryOptions } from '@/features/outbox/api/get-outbox';
import { signInSettingsQueryOptions } from '@/features/people/api/account-admin';
import { peopleQueryOptions } from '@/features/people/api/get-people';
import { procedureQueryOptions } from '@/features/procedures/api/get-procedure';
import {
  procedureFacetsQueryOptions,
  proceduresQueryOptions,
} from '@/features/procedures/api/get-procedures';
import { revisionQueryOptions } from '@/features/procedures/api/get-revision';
import { reviewQueueQueryOptions, revisionReviewQueryOptions } from '@/features/review/api/review-queries';
import { acknowledgementQueryOptions, reviewDueQueryOptions } from '@/features/review/api/acknowledgements';
import { instrumentsQueryOptions } from '@/features/registers/api/instruments';
import { qualificationsQueryOptions } from '@/features/registers/api/qualifications';
import { runQueryOptions } from '@/features/runs/api/get-run';
import { runnableProceduresQueryOptions } from '@/features/runs/api/get-runnable-procedures';
import { runsQueryOptions } from '@/features/runs/api/get-runs';
import { searchFromUrl, searchQueryOptions } from '@/features/search/api/search-procedures';
import { unitQueryOptions } from '@/features/units/api/get-unit';
import { unitTrendQueryOptions } from '@/features/units/api/get-unit-trend';
import { unitsQueryOptions } from '@/features/units/api/get-units';

// Who is signed in is needed by every page: ask at once, while the first route's code loads.
void queryClient.prefetchQuery(sessionQueryOptions());

// eslint-disable-next-line @typescript-eslint/no-explicit-any -- each page's queries have their own data types
type AnyQuery = FetchQueryOptions<any, any, any, any>;
type Queries = (args: LoaderFunctionArgs) => AnyQuery[] | Promise<AnyQuery[]>;

/**
 * A route loader that starts the page's queries alongside its code, so data does not wait for the
 * chunk. Not awaited: the page shows its own loading state, keeps working from cache when the
 * server is away (bench runs), and a failure reaches the page's error boundary through its query.
 */
const prefetch =
  (queries: Queries, { signedIn = true } = {}) =>
  (args: LoaderFunctionArgs) => {
    // Nobody signed in: the layout sends them to sign in; asking for the page's data would only be refused.
    if (signedIn && queryClient.getQueryData(sessionQueryOptions().queryKey)?.user === null) return null;
    void (async () => {
      for (const options of await queries(args))
        void queryClient.ensureQueryData({ ...options, revalidateIfStale: true }).catch(() => undefined);
    })().catch(() => undefined);
    return null;
  };

/** A page in the signed-in frame: lazy code, an optional prefetching loader, its own error boundary. */
const page = (
  path: string,
  load: () => Promise<{ default: ComponentType }>,
  queries?: Queries,
  back?: WayBack,
): RouteObject => ({
  path,
  lazy: async () => ({ Component: (await load()).default }),
  ...(queries && { loader: prefetch(queries) }),
  errorElement: <RouteError back={back} />,
});

const id = (args: LoaderFunctionArgs, name: string) => args.params[name] ?? '';
const searchOf = (args: LoaderFunctionArgs) => new URL(args.request.url).searchParams;

const toProcedures: WayBack = { to: paths.procedures.href(), label: 'All procedures' };
const toQueue: WayBack = { to: paths.reviewQueue.href(), label: 'Review queue' };
const toRuns: WayBack = { to: paths.runs.href(), label: 'All bench runs' };
const toUnits: WayBack = { to: paths.units.href(), label: 'All units' };

const router = createBrowserRouter([
  {
    path: paths.signIn.pattern,
    lazy: async () => ({ Component: (await import('./routes/sign-in')).default }),
    errorElement: <RouteError />,
  },
  {
    path: paths.setPassword.pattern,
    lazy: async () => ({ Component: (await import('./routes/set-password')).default }),
    loader: prefetch((a) => [invitationQueryOptions(id(a, 'token'))], { signedIn: false }),
    errorElement: <RouteError />,
  },
  {
    Component: AppLayout,
    errorElement: <RouteError />,
    children: [
      {
        index: true,
        lazy: async () => ({ Component: (await import('./routes/home')).default }),
        loader: prefetch(() => [homeQueryOptions()]),
        errorElement: <RouteError />,
      },
      page(
        paths.procedures.pattern,
        () => import('./routes/procedures/list'),
        // The list's address rules sit beside zod schemas: imported lazily, so no schema is built in the
        // entry before zod is told not to probe for eval (the CSP forbids it; see lib/zod-config.ts).
        async (a) => {
          const { procedureListFromUrl } = await import('@/features/procedures/api/list-from-url');
          return [
            proceduresQueryOptions(procedureListFromUrl(searchOf(a)).query),
            procedureFacetsQueryOptions(),
          ];
        },
      ),
      page(paths.newProcedure.pattern, () => import('./routes/procedures/new'), undefined, toProcedures),
      page(
        paths.procedure.pattern,
        () => import('./routes/procedures/procedure'),
        (a) => [procedureQueryOptions(id(a, 'procedureId'))],
        toProcedures,
      ),
      page(
        paths.revision.pattern,
        () => import('./routes/procedures/revision'),
        (a) => [revisionQueryOptions(id(a, 'revisionId'))],
        toProcedures,
      ),
      // The editor chunk: the only importer of @tiptap/*.
      page(
        paths.editRevision.pattern,
        () => import('./routes/procedures/edit-revision'),
        (a) => [revisionQueryOptions(id(a, 'revisionId'))],
        toProcedures,
      ),
      page(
        paths.search.pattern,
        () => import('./routes/search'),
        (a) => {
          const search = searchFromUrl(searchOf(a));
          return search.q.trim() ? [searchQueryOptions(search)] : [];
        },
      ),
      page(
        paths.account.pattern,
        () => import('./routes/account'),
        () => [accountQueryOptions()],
      ),
      page(
        paths.people.pattern,
        () => import('./routes/admin/people'),
        () => [peopleQueryOptions(), signInSettingsQueryOptions()],
      ),
      page(
        paths.reviewQueue.pattern,
        () => import('./routes/review/queue'),
        () => [reviewQueueQueryOptions()],
      ),
      page(
        paths.reviewDue.pattern,
        () => import('./routes/review/due'),
        () => [reviewDueQueryOptions()],
      ),
      page(
        paths.acknowledgeRevision.pattern,
        () => import('./routes/review/acknowledge'),
        (a) => [acknowledgementQueryOptions(id(a, 'revisionId'))],
        toProcedures,
      ),
      page(
        paths.reviewRevision.pattern,
        () => import('./routes/review/revision'),
        (a) => [revisionReviewQueryOptions(id(a, 'revisionId'))],
        toQueue,
      ),
      page(
        paths.audit.pattern,
        () => import('./routes/admin/audit'),
        () => [auditLogQueryOptions({ page: 1 }), peopleQueryOptions()],
      ),
      page(
        paths.outbox.pattern,
        () => import('./routes/admin/outbox'),
        () => [outboxQueryOptions('', 1)],
      ),
      page(paths.apiReference.pattern, () => import('./routes/admin/api-reference')),
      page(
        paths.instruments.pattern,
        () => import('./routes/registers/instruments'),
        () => [instrumentsQueryOptions()],
      ),
      page(
        paths.qualifications.pattern,
        () => import('./routes/registers/qualifications'),
        () => [qualificationsQueryOptions()],
      ),
      page(
        paths.followUps.pattern,
        () => import('./routes/follow-ups'),
        () => [followUpsQueryOptions()],
      ),
      page(
        paths.units.pattern,
        () => import('./routes/units/units'),
        () => [unitsQueryOptions()],
      ),
      page(
        paths.unit.pattern,
        () => import('./routes/units/unit'),
        (a) => [unitQueryOptions(id(a, 'unitId')), unitTrendQueryOptions(id(a, 'unitId'))],
        toUnits,
      ),
      page(
        paths.runs.pattern,
        () => import('./routes/runs/runs'),
        () => (['in_progress', 'signed', 'abandoned'] as const).map((status) => runsQueryOptions({ status })),
      ),
      page(
        paths.newRun.pattern,
        () => import('./routes/runs/new-run'),
        (a) => {
          const revision = searchOf(a).get('revision');
          return [
            unitsQueryOptions(),
            runnableProceduresQueryOptions(),
            ...(revision ? [revisionQueryOptions(revision)] : []),
          ];
        },
        toRuns,
      ),
      page(paths.runDecisions.pattern, () => import('./routes/runs/decisions'), undefined, toRuns),
      page(
        paths.run.pattern,
        () => import('./routes/runs/run'),
        (a) => [runQueryOptions(id(a, 'runId'))],
        toRuns,
      ),
      page(
        paths.runSheet.pattern,
        () => import('./routes/runs/run-sheet'),
        (a) => [runQueryOptions(id(a, 'runId'))],
        toRuns,
      ),
      page('*', () => import('./routes/not-found')),
    ],
  },
]);

// Data fetched since a navigation began was asked for by its loaders (query-client.ts, refetchOnMount).
let navigatingTo: string | undefined;
router.subscribe(({ navigation }) => {
  if (navigation.location && navigation.location.key !== navigatingTo) markNavigation();
  navigatingTo = navigation.location?.key;
});

export function AppRouter() {
  return <RouterProvider router={router} />;
}
