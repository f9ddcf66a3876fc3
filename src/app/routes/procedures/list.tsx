import { useEffect, useState } from 'react';
import { Link } from 'react-router-dom';
import { Notice } from '@/components/ui/notice';
import { paths } from '@/config/paths';
import { hasRole, useSession } from '@/features/auth/api/get-session';
import { useProcedures } from '@/features/procedures/api/get-procedures';
import { applyFilters, ProcedureFilters, type Filters } from '@/features/procedures/components/procedure-filters';
import { ProcedureTable } from '@/features/procedures/components/procedure-table';

export default function ProceduresPage() {
  const session = useSession();
  const query = useProcedures();
  const [filters, setFilters] = useState<Filters>({ family: '', tag: '', state: '' });
  const isAuthor = hasRole(session.data?.user, 'author');
  useEffect(() => {
    document.title = 'Procedures · Benchwright';
  }, []);
  const all = query.data?.procedures ?? [];
  const shown = applyFilters(all, filters);
  return (
    <section className="flex flex-col gap-4">
      <div className="flex flex-wrap items-center gap-3">
        <h1 className="text-2xl font-semibold">Procedures</h1>
        {isAuthor && (
          <Link to={paths.newProcedure.href()} className="ml-auto inline-flex min-h-11 items-center rounded-md border border-accent-deep bg-accent px-4 text-sm font-semibold text-white hover:bg-accent-deep">
            New procedure
          </Link>
        )}
      </div>
      {!isAuthor && hasRole(session.data?.user, 'technician') && <p className="text-sm text-graphite-soft">Procedures with an approved revision.</p>}
      {query.isPending && <p className="text-graphite-soft">Loading…</p>}
      {query.isError && <Notice tone="error">{query.error.message}</Notice>}
      {query.data && (
        <>
          <ProcedureFilters procedures={all} value={filters} onChange={setFilters} />
          <p className="text-sm text-graphite-soft" aria-live="polite">
            Showing {shown.length} of {all.length}.
          </p>
          {shown.length ? <ProcedureTable procedures={shown} /> : <Notice>No procedure matches these filters.</Notice>}
        </>
      )}
    </section>
  );
}
