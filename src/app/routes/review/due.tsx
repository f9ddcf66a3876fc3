import { useEffect } from 'react';
import { Link } from 'react-router-dom';
import { Problem } from '@/components/errors/problem';
import { DataTable } from '@/components/ui/data-table';
import { Loading } from '@/components/ui/loading';
import { Notice } from '@/components/ui/notice';
import { paths } from '@/config/paths';
import { hasRole, useSession } from '@/features/auth/api/get-session';
import { useReviewDue } from '@/features/review/api/acknowledgements';

const day = (iso: string) => iso.slice(0, 10);

/** Approved revisions due or overdue for their periodic review, soonest first. */
export default function ReviewDuePage() {
  const session = useSession();
  const due = useReviewDue();
  useEffect(() => {
    document.title = 'Reviews due · Benchwright';
  }, []);
  if (!hasRole(session.data?.user, 'reviewer', 'admin'))
    return <Notice tone="error">The periodic review list is for reviewers.</Notice>;
  return (
    <section className="flex flex-col gap-4">
      <h1 className="text-2xl font-semibold">Reviews due</h1>
      <p className="text-sm text-graphite-soft">
        Each approved revision is looked at again{' '}
        {due.data ? `${due.data.intervalMonths} months` : 'a set time'} after its approval. Overdue first,
        then those falling due in the next 60 days.
      </p>
      {due.isPending && <Loading />}
      {due.isError && <Problem error={due.error} heading="h2" onRetry={() => void due.refetch()} />}
      {due.data &&
        (due.data.items.length === 0 ? (
          <p className="text-graphite-soft">No procedure is due for review.</p>
        ) : (
          <DataTable
            columns={['Procedure', 'Revision', 'Approved', 'Review due', 'Status']}
            label="Reviews due"
          >
            {due.data.items.map((i) => (
              <tr key={i.revisionId} className="border-b border-rule last:border-0">
                <td className="px-3 py-2">
                  <Link
                    to={paths.revision.href(i.revisionId)}
                    className="font-semibold text-accent-deep underline"
                  >
                    {i.title}
                  </Link>{' '}
                  <span className="text-graphite-soft">{i.equipmentModel}</span>
                </td>
                <td className="px-3 py-2">
                  <span className="value">{i.number}</span>
                </td>
                <td className="px-3 py-2">
                  <time dateTime={i.approvedAt}>{day(i.approvedAt)}</time>
                </td>
                <td className="px-3 py-2">
                  <time dateTime={i.dueAt}>{day(i.dueAt)}</time>
                </td>
                <td className={`px-3 py-2 font-semibold ${i.status === 'overdue' ? 'text-out' : ''}`}>
                  {i.status === 'overdue' ? 'overdue' : 'due soon'}
                </td>
              </tr>
            ))}
          </DataTable>
        ))}
    </section>
  );
}
