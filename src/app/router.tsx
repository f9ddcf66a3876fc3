import { createBrowserRouter, RouterProvider } from 'react-router-dom';
import { paths } from '@/config/paths';
import { AppLayout } from '@/components/layouts/app-layout';
import { RouteError } from './routes/route-error';
import { queryClient } from '@/lib/query-client';
import { sessionQueryOptions } from '@/features/auth/api/get-session';
import { revisionQueryOptions } from '@/features/procedures/api/get-revision';

// Who is signed in is needed by every page: ask at once, while the first route's code loads.
void queryClient.prefetchQuery(sessionQueryOptions());

const router = createBrowserRouter([
  {
    path: paths.signIn.pattern,
    lazy: async () => ({ Component: (await import('./routes/sign-in')).default }),
    errorElement: <RouteError />,
  },
  {
    path: paths.setPassword.pattern,
    lazy: async () => ({ Component: (await import('./routes/set-password')).default }),
    errorElement: <RouteError />,
  },
  {
    Component: AppLayout,
    errorElement: <RouteError />,
    children: [
      { index: true, lazy: async () => ({ Component: (await import('./routes/home')).default }) },
      {
        path: paths.procedures.pattern,
        lazy: async () => ({ Component: (await import('./routes/procedures/list')).default }),
      },
      {
        path: paths.newProcedure.pattern,
        lazy: async () => ({ Component: (await import('./routes/procedures/new')).default }),
      },
      {
        path: paths.procedure.pattern,
        lazy: async () => ({ Component: (await import('./routes/procedures/procedure')).default }),
      },
      {
        path: paths.revision.pattern,
        // Fetch the revision alongside the page's code, not after it.
        loader: ({ params }) => {
          void queryClient.prefetchQuery(revisionQueryOptions(params.revisionId!));
          return null;
        },
        lazy: async () => ({ Component: (await import('./routes/procedures/revision')).default }),
      },
      // The editor chunk: the only importer of @tiptap/*.
      {
        path: paths.editRevision.pattern,
        lazy: async () => ({ Component: (await import('./routes/procedures/edit-revision')).default }),
      },
      {
        path: paths.search.pattern,
        lazy: async () => ({ Component: (await import('./routes/search')).default }),
      },
      {
        path: paths.account.pattern,
        lazy: async () => ({ Component: (await import('./routes/account')).default }),
      },
      {
        path: paths.people.pattern,
        lazy: async () => ({ Component: (await import('./routes/admin/people')).default }),
      },
      {
        path: paths.reviewQueue.pattern,
        lazy: async () => ({ Component: (await import('./routes/review/queue')).default }),
      },
      {
        path: paths.reviewRevision.pattern,
        lazy: async () => ({ Component: (await import('./routes/review/revision')).default }),
      },
      {
        path: paths.audit.pattern,
        lazy: async () => ({ Component: (await import('./routes/admin/audit')).default }),
      },
      {
        path: paths.outbox.pattern,
        lazy: async () => ({ Component: (await import('./routes/admin/outbox')).default }),
      },
      {
        path: paths.apiReference.pattern,
        lazy: async () => ({ Component: (await import('./routes/admin/api-reference')).default }),
      },
      {
        path: paths.units.pattern,
        lazy: async () => ({ Component: (await import('./routes/units/units')).default }),
      },
      {
        path: paths.unit.pattern,
        lazy: async () => ({ Component: (await import('./routes/units/unit')).default }),
      },
      {
        path: paths.runs.pattern,
        lazy: async () => ({ Component: (await import('./routes/runs/runs')).default }),
      },
      {
        path: paths.newRun.pattern,
        lazy: async () => ({ Component: (await import('./routes/runs/new-run')).default }),
      },
      {
        path: paths.run.pattern,
        lazy: async () => ({ Component: (await import('./routes/runs/run')).default }),
      },
      {
        path: paths.runSheet.pattern,
        lazy: async () => ({ Component: (await import('./routes/runs/run-sheet')).default }),
      },
      { path: '*', lazy: async () => ({ Component: (await import('./routes/not-found')).default }) },
    ],
  },
]);

export function AppRouter() {
  return <RouterProvider router={router} />;
}
