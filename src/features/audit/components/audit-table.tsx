import type { AuditEntryView } from '@shared/schemas/review';

/** Details as short "key: value" pairs; values are shown as text, never as markup. */
const detailText = (d: Record<string, unknown>) =>
  Object.entries(d)
    .map(([k, v]) => `${k}: ${typeof v === 'string' ? v : JSON.stringify(v)}`)
    .join(' · ');

export function AuditTable({ entries }: { entries: AuditEntryView[] }) {
  if (!entries.length) return <p className="text-graphite-soft">No entries match these filters.</p>;
  return (
    <div className="overflow-x-auto rounded-lg border border-rule bg-card">
      <table aria-label="Audit log" className="w-full text-left text-sm">
        <thead className="border-b border-rule bg-paper-deep">
          <tr>
            <th className="px-3 py-2">When (UTC)</th>
            <th className="px-3 py-2">Action</th>
            <th className="px-3 py-2">Person</th>
            <th className="px-3 py-2">Subject</th>
            <th className="px-3 py-2">Details</th>
          </tr>
        </thead>
        <tbody>
          {entries.map((e) => (
            <tr key={e.id} className="border-b border-rule align-top last:border-0">
              <td className="px-3 py-2">
                <time className="value" dateTime={e.at}>
                  {e.at.slice(0, 19).replace('T', ' ')}
                </time>
              </td>
              <td className="px-3 py-2 font-semibold">{e.action}</td>
              <td className="px-3 py-2">{e.actor?.displayName ?? <span className="text-graphite-soft">—</span>}</td>
              <td className="px-3 py-2">{e.subject}</td>
              <td className="max-w-md break-words px-3 py-2 text-xs text-graphite-soft">
                {detailText(e.details)}
                {e.ip && <span> · from {e.ip}</span>}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
