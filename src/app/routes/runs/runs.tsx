import { useEffect } from 'react';
import { Link } from 'react-router-dom';
import { Problem } from '@/components/errors/problem';
import { paths } from '@/config/paths';
import { hasRole, useSession } from '@/features/auth/api/get-session';
import { useRuns } from '@/features/runs/api/get-runs';
import { RunsTable } from '@/features/runs/components/runs-table';

export default function RunsPage() {
  const session = useSession();
  const open = useRuns({ status: 'in_progress' });
  const signed = useRuns({ status: 'signed' });
  const abandoned = useRuns({ status: 'abandoned' });
  useEffect(() => {
    document.title = 'Bench runs · Benchwright';
  }, []);
  const runPath = (id: string) => paths.run.href(id);
  const isTechnician = hasRole(session.data?.user, 'technician');
  return (
    <section className="flex flex-col gap-6">
      <div className="flex flex-wrap items-center gap-4">
        <h1 className="text-2xl font-semibold">Bench runs</h1>
        {isTechnician && (
          <Link
            to={paths.newRun.href()}
            className="ml-auto inline-flex min-h-12 items-center rounded-md border border-accent-deep bg-accent px-4 font-semibold text-white"
          >
            Start a bench run
          </Link>
        )}
      </div>
      <h2 className="text-lg font-semibold">In progress</h2>
      {open.isError && <Problem error={open.error} heading="h2" onRetry={() => void open.refetch()} />}
      {open.data && (
        <RunsTable
          runs={open.data.runs}
          runPath={runPath}
          empty={
            isTechnician
              ? 'No bench run in progress. Start one with “Start a bench run” above, or from a unit’s page.'
              : 'No bench run in progress.'
          }
        />
      )}
      <h2 className="text-lg font-semibold">Signed run sheets</h2>
      {signed.data && (
        <RunsTable
          runs={signed.data.runs}
          runPath={paths.runSheet.href}
          empty="No signed run sheets yet: a bench run is listed here once its technician signs it."
        />
      )}
      {!!abandoned.data?.runs.length && (
        <>
          <h2 className="text-lg font-semibold">Closed as abandoned</h2>
          <RunsTable runs={abandoned.data.runs} runPath={paths.runSheet.href} />
        </>
      )}
    </section>
  );
}
