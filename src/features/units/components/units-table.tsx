import { Link } from 'react-router-dom';
import type { UnitListItem } from '@shared/schemas/units';

export function UnitsTable({ units, unitPath }: { units: UnitListItem[]; unitPath: (id: string) => string }) {
  if (!units.length) return <p className="text-sm text-graphite-soft">No units match.</p>;
  return (
    <div className="overflow-x-auto rounded-lg border border-rule bg-card">
      <table className="w-full text-left text-sm">
        <thead className="border-b border-rule bg-paper-deep">
          <tr>
            <th className="px-3 py-2">Model</th>
            <th className="px-3 py-2">Serial</th>
            <th className="px-3 py-2">Owner</th>
            <th className="px-3 py-2">Job</th>
            <th className="px-3 py-2">Runs</th>
            <th className="px-3 py-2">Last run</th>
          </tr>
        </thead>
        <tbody>
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
        </tbody>
      </table>
    </div>
  );
}
