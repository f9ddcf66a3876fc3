import { Link } from 'react-router-dom';
import { DataTable } from '@/components/ui/data-table';
import type { QueueItem } from '@shared/schemas/review';
import { paths } from '@/config/paths';
import { formatAge, formatUtc } from './format';

/** Revisions waiting for a decision, oldest first; one's own work is marked, not hidden. */
export function QueueTable({ items }: { items: QueueItem[] }) {
  if (!items.length) return <p className="text-graphite-soft">Nothing is waiting for review.</p>;
  return (
    <DataTable columns={['Procedure', 'Revision', 'Author', 'Submitted', 'Waiting']} label="Review queue">
      {items.map((i) => (
        <tr key={i.revisionId} className="border-b border-rule last:border-0">
          <td className="px-3 py-2">
            <Link
              to={paths.reviewRevision.href(i.revisionId)}
              className="font-semibold text-accent-deep underline"
            >
              {i.title}
            </Link>{' '}
            <span className="text-graphite-soft">{i.equipmentModel}</span>
            {i.ownWork && (
              <span className="ml-2 rounded border border-rule px-1 text-xs">
                your work — another reviewer decides
              </span>
            )}
          </td>
          <td className="px-3 py-2">
            <span className="value">{i.number}</span>
          </td>
          <td className="px-3 py-2">{i.author.displayName}</td>
          <td className="px-3 py-2">
            <time dateTime={i.submittedAt}>{formatUtc(i.submittedAt)}</time>
          </td>
          <td className="px-3 py-2">
            <span className="value">{formatAge(i.ageSeconds)}</span>
          </td>
        </tr>
      ))}
    </DataTable>
  );
}
