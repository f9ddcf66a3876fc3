import { Link } from 'react-router-dom';
import type { RunListItem } from '@shared/schemas/runs';

export function RunsTable({ runs, runPath }: { runs: RunListItem[]; runPath: (id: string) => string }) {
  if (!runs.length) return <p className="text-sm text-graphite-soft">No bench runs here yet.</p>;
  return (
    <div className="overflow-x-auto rounded-lg border border-rule bg-card">
      <table className="w-full text-left text-sm">
        <thead className="border-b border-rule bg-paper-deep">
          <tr>
            <th className="px-3 py-2">Procedure</th>
            <th className="px-3 py-2">Unit</th>
            <th className="px-3 py-2">Progress</th>
            <th className="px-3 py-2">Status</th>
            <th className="px-3 py-2">Started</th>
          </tr>
        </thead>
        <tbody>
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
                {r.status === 'signed' ? 'Signed' : 'In progress'}
                {r.outOfTolerance && <span className="ml-2 font-semibold text-out">▲ out of tolerance</span>}
              </td>
              <td className="px-3 py-2">
                {new Date(r.startedAt).toLocaleString()} · {r.startedBy.displayName}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
