import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { DataTable } from '@/components/ui/data-table';
import { MARK_WORDS } from '@shared/runs/run-sheet-model';
import type { RunListItem } from '@shared/schemas/runs';

export function RunsTable({
  runs,
  runPath,
  empty = 'No bench runs here yet.',
}: {
  runs: RunListItem[];
  runPath: (id: string) => string;
  /** What to say, and what to do next, when there is none. */
  empty?: ReactNode;
}) {
  if (!runs.length) return <p className="text-sm text-graphite-soft">{empty}</p>;
  return (
    <DataTable columns={['Procedure', 'Unit', 'Progress', 'Status', 'Started', 'Performed by']}>
      {runs.map((r) => (
        <tr key={r.id} className="border-b border-rule last:border-0">
          <td className="px-3 py-2">
            <Link to={runPath(r.id)} className="font-semibold text-accent-deep underline">
              {r.title}
            </Link>{' '}
            <span className="text-graphite-soft">rev. {r.revisionNumber}</span>
          </td>
          <td className="px-3 py-2">
            {r.unit.model} <span className="value">{r.unit.serial}</span>
          </td>
          <td className="value px-3 py-2">
            {r.progress.done} of {r.progress.total}
          </td>
          <td className="px-3 py-2">
            {{ signed: 'Signed', abandoned: 'Closed as abandoned', in_progress: 'In progress' }[r.status]}
            {r.onHold && <span className="ml-2 font-semibold text-out">on hold: revision withdrawn</span>}
            {r.atHoldPoint && <span className="ml-2 font-semibold text-out">stopped at a hold point</span>}
            {r.outOfTolerance && <span className="ml-2 font-semibold text-out">▲ {MARK_WORDS.out}</span>}
          </td>
          <td className="px-3 py-2">
            {new Date(r.startedAt).toLocaleString()} · {r.startedBy.displayName}
          </td>
          <td className="px-3 py-2">{r.performedBy.displayName}</td>
        </tr>
      ))}
    </DataTable>
  );
}
