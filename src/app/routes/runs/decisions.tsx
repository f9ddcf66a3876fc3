import { useEffect } from 'react';
import { Link } from 'react-router-dom';
import { formatUtc } from '@shared/runs/run-sheet-model';
import { Problem } from '@/components/errors/problem';
import { DataTable } from '@/components/ui/data-table';
import { Loading } from '@/components/ui/loading';
import { Notice } from '@/components/ui/notice';
import { paths } from '@/config/paths';
import { hasRole, useSession } from '@/features/auth/api/get-session';
import { useAwaitingDecisions } from '@/features/runs/api/run-decisions';

/** Hold points and deviations on open runs, waiting for a reviewer's or admin's decision. */
export default function RunDecisionsPage() {
  const session = useSession();
  const senior = hasRole(session.data?.user, 'reviewer', 'admin');
  const awaiting = useAwaitingDecisions(senior);
  useEffect(() => {
    document.title = 'Holds and deviations to decide · Benchwright';
  }, []);
  if (!senior) return <Notice tone="error">Holds and deviations are decided by reviewers and admins.</Notice>;
  return (
    <section className="flex flex-col gap-4">
      <h1 className="text-2xl font-semibold">Holds and deviations to decide</h1>
      <p className="text-sm text-graphite-soft">
        A run stopped at a hold point waits for you to continue or abandon it; a deviation waits for your
        approval before its run can be signed. Runs you perform yourself are left out.
      </p>
      {awaiting.isPending && <Loading />}
      {awaiting.isError && (
        <Problem error={awaiting.error} heading="h2" onRetry={() => void awaiting.refetch()} />
      )}
      {awaiting.data &&
        (awaiting.data.awaiting.length === 0 ? (
          <p className="text-graphite-soft">Nothing waits for a decision.</p>
        ) : (
          <DataTable columns={['Run', 'Waiting', 'Step', 'Since']} label="Holds and deviations to decide">
            {awaiting.data.awaiting.map((a) => (
              <tr key={a.id} className="border-b border-rule last:border-0">
                <td className="px-3 py-2">
                  <Link to={paths.run.href(a.runId)} className="font-semibold text-accent-deep underline">
                    {a.unit.model} {a.unit.serial}
                  </Link>{' '}
                  <span className="text-graphite-soft">
                    {a.runTitle}, {a.performedBy.displayName}
                  </span>
                </td>
                <td className={`px-3 py-2 font-semibold ${a.kind === 'hold' ? 'text-out' : ''}`}>
                  {a.kind === 'hold' ? 'Hold point' : 'Deviation'}
                </td>
                <td className="px-3 py-2">
                  <span className="value">{a.step.position}.</span> {a.step.text}
                  <span className="block text-sm text-graphite-soft">{a.detail}</span>
                </td>
                <td className="px-3 py-2">
                  <time dateTime={a.since} className="value">
                    {formatUtc(a.since)}
                  </time>
                </td>
              </tr>
            ))}
          </DataTable>
        ))}
    </section>
  );
}
