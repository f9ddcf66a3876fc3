import { useEffect, useState } from 'react';
import { Problem } from '@/components/errors/problem';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';
import { useAuditLog, type AuditFilters } from '@/features/audit/api/get-audit';
import { AuditTable } from '@/features/audit/components/audit-table';
import { ChainCheck } from '@/features/audit/components/chain-check';
import { hasRole, useSession } from '@/features/auth/api/get-session';
import { usePeople } from '@/features/people/api/get-people';
import { auditActionLabel } from '@shared/audit-actions';

export default function AuditPage() {
  const session = useSession();
  const isAdmin = hasRole(session.data?.user, 'admin');
  const [filters, setFilters] = useState<AuditFilters>({ page: 1 });
  const log = useAuditLog(filters);
  const people = usePeople();
  useEffect(() => {
    document.title = 'Audit log · Benchwright';
  }, []);
  if (!isAdmin) return <Notice tone="error">This page is for admins.</Notice>;
  const set = (patch: Partial<AuditFilters>) =>
    setFilters((f) => ({ ...f, ...patch, page: patch.page ?? 1 }));
  const pages = log.data ? Math.max(1, Math.ceil(log.data.total / log.data.pageSize)) : 1;
  return (
    <section className="flex flex-col gap-4">
      <h1 className="text-2xl font-semibold">Audit log</h1>
      <p className="text-sm text-graphite-soft">
        Every state change, sign-off, sign-in failure, role change and deactivation. Entries can be added,
        never changed; each is chained to the one before by its SHA-256, so a change made around the
        database's guards shows up in the check.
      </p>
      <ChainCheck />
      <form className="flex flex-wrap items-end gap-3" onSubmit={(e) => e.preventDefault()}>
        <label className="flex flex-col gap-1 text-sm font-semibold">
          Action
          <select
            className="min-h-11 rounded-md border border-rule bg-card px-3 font-normal"
            value={filters.action ?? ''}
            onChange={(e) => set({ action: e.target.value || undefined })}
          >
            <option value="">All actions</option>
            {(log.data?.actions ?? []).map((a) => (
              <option key={a} value={a}>
                {auditActionLabel(a)}
              </option>
            ))}
          </select>
        </label>
        <label className="flex flex-col gap-1 text-sm font-semibold">
          Person
          <select
            className="min-h-11 rounded-md border border-rule bg-card px-3 font-normal"
            value={filters.personId ?? ''}
            onChange={(e) => set({ personId: e.target.value || undefined })}
          >
            <option value="">Everyone</option>
            {(people.data?.people ?? []).map((p) => (
              <option key={p.id} value={p.id}>
                {p.displayName}
              </option>
            ))}
          </select>
        </label>
        <label className="flex flex-col gap-1 text-sm font-semibold">
          From
          <input
            type="date"
            className="min-h-11 rounded-md border border-rule bg-card px-3 font-normal"
            value={filters.from ?? ''}
            onChange={(e) => set({ from: e.target.value || undefined })}
          />
        </label>
        <label className="flex flex-col gap-1 text-sm font-semibold">
          To
          <input
            type="date"
            className="min-h-11 rounded-md border border-rule bg-card px-3 font-normal"
            value={filters.to ?? ''}
            onChange={(e) => set({ to: e.target.value || undefined })}
          />
        </label>
      </form>
      {log.isError && <Problem error={log.error} heading="h2" onRetry={() => void log.refetch()} />}
      {log.data && (
        <>
          <AuditTable entries={log.data.entries} />
          <nav aria-label="Pages" className="flex items-center gap-3 text-sm">
            <Button
              variant="quiet"
              disabled={filters.page <= 1}
              whyDisabled="These are the newest."
              onClick={() => set({ page: filters.page - 1 })}
            >
              Newer
            </Button>
            <span>
              Page <span className="value">{filters.page}</span> of <span className="value">{pages}</span> (
              <span className="value">{log.data.total}</span> entries)
            </span>
            <Button
              variant="quiet"
              disabled={filters.page >= pages}
              whyDisabled="These are the oldest."
              onClick={() => set({ page: filters.page + 1 })}
            >
              Older
            </Button>
          </nav>
        </>
      )}
    </section>
  );
}
