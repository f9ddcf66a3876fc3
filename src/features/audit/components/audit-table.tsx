import type { AuditEntryView } from '@shared/schemas/review';
import { DataTable } from '@/components/ui/data-table';

/** Details as short "key: value" pairs; values are shown as text, never as markup. */
const detailText = (d: Record<string, unknown>) =>
  Object.entries(d)
    .map(([k, v]) => `${k}: ${typeof v === 'string' ? v : JSON.stringify(v)}`)
    .join(' · ');

export function AuditTable({ entries }: { entries: AuditEntryView[] }) {
  if (!entries.length) return <p className="text-graphite-soft">No entries match these filters.</p>;
  return (
    <DataTable columns={['When (UTC)', 'Action', 'Person', 'Subject', 'Details']} label="Audit log">
      {entries.map((e) => (
        <tr key={e.id} className="border-b border-rule align-top last:border-0">
          <td className="px-3 py-2">
            <time className="value" dateTime={e.at}>
              {e.at.slice(0, 19).replace('T', ' ')}
            </time>
          </td>
          <td className="px-3 py-2 font-semibold">{e.action}</td>
          <td className="px-3 py-2">
            {e.actor?.displayName ?? <span className="text-graphite-soft">—</span>}
          </td>
          <td className="px-3 py-2">{e.subject}</td>
          <td className="max-w-md break-words px-3 py-2 text-xs text-graphite-soft">
            {detailText(e.details)}
            {e.ip && <span> · from {e.ip}</span>}
          </td>
        </tr>
      ))}
    </DataTable>
  );
}
