import { auditSentence } from '@shared/audit-actions';
import type { AuditEntryView } from '@shared/schemas/review';
import { DataTable } from '@/components/ui/data-table';

/** Each entry as a sentence, with the raw record (action key, ids, details, address) one click away. */
export function AuditTable({ entries }: { entries: AuditEntryView[] }) {
  if (!entries.length) return <p className="text-graphite-soft">No entries match these filters.</p>;
  return (
    <DataTable columns={['When (UTC)', 'What happened']} label="Audit log">
      {entries.map((e) => (
        <tr key={e.id} data-action={e.action} className="border-b border-rule align-top last:border-0">
          <td className="px-3 py-2">
            <time className="value" dateTime={e.at}>
              {e.at.slice(0, 19).replace('T', ' ')}
            </time>
          </td>
          <td className="px-3 py-2">
            <p>
              {auditSentence(e.action, {
                actor: e.actor?.displayName ?? null,
                subject: e.subject,
                details: e.details,
              })}
            </p>
            <details className="text-xs text-graphite-soft">
              <summary className="cursor-pointer">Record</summary>
              <pre className="mt-1 whitespace-pre-wrap break-all font-mono">
                {JSON.stringify(
                  {
                    id: e.id,
                    action: e.action,
                    actor: e.actor,
                    subject: e.subject,
                    details: e.details,
                    ip: e.ip,
                  },
                  null,
                  2,
                )}
              </pre>
            </details>
          </td>
        </tr>
      ))}
    </DataTable>
  );
}
