import { useEffect, useRef, useState } from 'react';
import { Link, useSearchParams } from 'react-router-dom';
import type { SortingState } from '@tanstack/react-table';
import { PROCEDURE_PAGE_SIZES } from '@shared/schemas/procedures';
import { Problem } from '@/components/errors/problem';
import { Notice } from '@/components/ui/notice';
import { Pager } from '@/components/ui/pager';
import { paths } from '@/config/paths';
import { useDebounced } from '@/hooks/use-debounced';
import { hasRole, useSession } from '@/features/auth/api/get-session';
import { useProcedureFacets, useProcedures } from '@/features/procedures/api/get-procedures';
import { procedureListFromUrl } from '@/features/procedures/api/list-from-url';
import { ProcedureFilters } from '@/features/procedures/components/procedure-filters';
import { ProcedureTable } from '@/features/procedures/components/procedure-table';
import { Loading } from '@/components/ui/loading';

/** The list's state lives in the address, so a reload, the back button or a shared link keeps it. */
function useListState() {
  const [params, setParams] = useSearchParams();
  const update = (next: Record<string, string>) => {
    const merged = new URLSearchParams(params);
    for (const [k, v] of Object.entries(next)) {
      if (v) merged.set(k, v);
      else merged.delete(k);
    }
    setParams(merged, { replace: true });
  };
  return { ...procedureListFromUrl(params), update };
}

export default function ProceduresPage() {
  const session = useSession();
  const { sort, dir, size, page, filters, q, query: listQuery, update } = useListState();
  // The title box updates the address once typing pauses.
  const [title, setTitle] = useState(q);
  const settled = useDebounced(title.trim(), 250);
  // Only a settled change of the box moves the address…
  const lastSettled = useRef(settled);
  useEffect(() => {
    if (lastSettled.current === settled) return;
    lastSettled.current = settled;
    if (settled !== q) update({ q: settled, page: '' });
  }, [settled, q, update]);
  // …and the address moving on its own (back, a link) refills the box.
  const lastQ = useRef(q);
  useEffect(() => {
    if (lastQ.current === q) return;
    lastQ.current = q;
    if (q !== settled) setTitle(q);
  }, [q, settled]);
  const query = useProcedures(listQuery);
  const facets = useProcedureFacets();
  const isAuthor = hasRole(session.data?.user, 'author');
  useEffect(() => {
    document.title = 'Procedures · Benchwright';
  }, []);
  const data = query.data;
  const pages = data ? Math.max(1, Math.ceil(data.total / size)) : 1;
  const sorting: SortingState = [{ id: sort, desc: dir === 'desc' }];
  return (
    <section className="flex flex-col gap-4">
      <div className="flex flex-wrap items-center gap-3">
        <h1 className="text-2xl font-semibold">Procedures</h1>
        {isAuthor && (
          <Link
            to={paths.newProcedure.href()}
            className="ml-auto inline-flex min-h-11 items-center rounded-md border border-accent-deep bg-accent px-4 text-sm font-semibold text-white hover:bg-accent-deep"
          >
            New procedure
          </Link>
        )}
      </div>
      {!isAuthor && hasRole(session.data?.user, 'technician') && (
        <p className="text-sm text-graphite-soft">Procedures with an approved revision.</p>
      )}
      <div className="flex flex-wrap items-end gap-3">
        <label className="flex flex-col gap-1 text-xs font-semibold">
          Title contains
          <input
            type="search"
            className="min-h-10 w-64 rounded border border-rule bg-card px-2 text-sm font-normal"
            value={title}
            onChange={(e) => setTitle(e.target.value)}
            maxLength={160}
          />
        </label>
        <ProcedureFilters facets={facets.data} value={filters} onChange={(f) => update({ ...f, page: '' })} />
      </div>
      {query.isPending && <Loading />}
      {query.isError && <Problem error={query.error} heading="h2" onRetry={() => void query.refetch()} />}
      {data && (
        <>
          <div className="flex flex-wrap items-center gap-3 text-sm text-graphite-soft">
            <p aria-live="polite">
              {data.total === 0
                ? 'No procedures.'
                : `Showing ${(data.offset + 1).toLocaleString()}–${(data.offset + data.procedures.length).toLocaleString()} of ${data.total.toLocaleString()}.`}
            </p>
            <label className="ml-auto flex items-center gap-2">
              Per page
              <select
                className="min-h-10 rounded border border-rule bg-card px-2"
                value={size}
                onChange={(e) => update({ size: e.target.value, page: '' })}
              >
                {PROCEDURE_PAGE_SIZES.map((n) => (
                  <option key={n} value={n}>
                    {n}
                  </option>
                ))}
              </select>
            </label>
          </div>
          {data.procedures.length ? (
            <div className={query.isPlaceholderData ? 'opacity-70' : undefined}>
              <ProcedureTable
                procedures={data.procedures}
                sorting={sorting}
                onSortingChange={(s) =>
                  update({ sort: s[0]?.id ?? '', dir: s[0] ? (s[0].desc ? 'desc' : 'asc') : '', page: '' })
                }
              />
            </div>
          ) : (
            <Notice>
              {data.total ? (
                'This page is past the end of the list.'
              ) : q || Object.values(filters).some(Boolean) ? (
                <>
                  {q
                    ? `No procedure title contains “${q}” with these filters.`
                    : 'No procedure matches these filters.'}{' '}
                  <Link to={paths.procedures.href()} className="font-semibold text-accent underline">
                    Show every procedure
                  </Link>{' '}
                  or{' '}
                  <Link to={paths.search.href(q)} className="font-semibold text-accent underline">
                    search the procedures’ text
                  </Link>
                  .
                </>
              ) : isAuthor ? (
                <>
                  No procedures yet.{' '}
                  <Link to={paths.newProcedure.href()} className="font-semibold text-accent underline">
                    Write the first one
                  </Link>
                  ; a reviewer approves it before it is used at the bench.
                </>
              ) : (
                'No approved procedure yet: an author writes one and a reviewer approves it.'
              )}
            </Notice>
          )}
          <Pager
            page={page}
            pages={pages}
            label="Procedure list pages"
            onPage={(p) => update({ page: p > 1 ? String(p) : '' })}
          />
        </>
      )}
    </section>
  );
}
