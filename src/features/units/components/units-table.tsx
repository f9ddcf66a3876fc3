import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { DataTable } from '@/components/ui/data-table';
import type { UnitListItem } from '@shared/schemas/units';

export function UnitsTable({
  units,
  unitPath,
  empty = 'No units match.',
}: {
  units: UnitListItem[];
  unitPath: (id: string) => string;
  /** What to say, and what to do next, when there is none. */
  empty?: ReactNode;
}) {
  if (!units.length) return <p className="text-sm text-graphite-soft">{empty}</p>;
  return (
    <DataTable columns={['Model', 'Serial', 'Owner', 'Job', 'Runs', 'Last run']}>
      {units.map((u) => (
        <tr key={u.id} className="border-b border-rule last:border-0">
          <td className="px-3 py-2">{u.model}</td>
          <td className="px-3 py-2">
            <Link to={unitPath(u.id)} className="value font-semibold text-accent-deep underline">
              {u.serial}
            </Link>
          </td>
          <td className="px-3 py-2">{u.owner || '—'}</td>
          <td className="value px-3 py-2">{u.jobNumber || '—'}</td>
          <td className="px-3 py-2">
            <span className="value">{u.runCount}</span>
            {u.openRuns > 0 && <span className="ml-2 text-accent-deep">{u.openRuns} open</span>}
            {u.outRuns > 0 && <span className="ml-2 font-semibold text-out">▲ {u.outRuns} out</span>}
          </td>
          <td className="px-3 py-2">{u.lastRunAt ? new Date(u.lastRunAt).toLocaleDateString() : '—'}</td>
        </tr>
      ))}
    </DataTable>
  );
}
