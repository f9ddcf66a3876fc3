import { useEffect, useRef, useState } from 'react';
import { Link, useSearchParams } from 'react-router-dom';
import type { SortingState } from '@tanstack/react-table';
import { PROCEDURE_PAGE_SIZES, PROCEDURE_SORTS, type ProcedureSort } from '@shared/schemas/procedures';
import type { RevisionStateName } from '@shared/schemas/revision-states';
import { Notice } from '@/components/ui/notice';
import { Pager } from '@/components/ui/pager';
import { paths } from '@/config/paths';
import { useDebounced } from '@/hooks/use-debounced';
import { hasRole, useSession } from '@/features/auth/api/get-session';
import { useProcedureFacets, useProcedures } from '@/features/procedures/api/get-procedures';
import { ProcedureFilters, type Filters } from '@/features/procedures/components/procedure-filters';
import { ProcedureTable } from '@/features/procedures/components/procedure-table';

const oneOf = <T extends string>(allowed: readonly T[], v: string | null, fallback: T): T =>
  v && (allowed as readonly string[]).includes(v) ? (v as T) : fallback;

/** The list's state lives in the address, so a reload, the back button or a shared link keeps it. */
function useListState() {
  const [params, setParams] = useSearchParams();
  const sort = oneOf<ProcedureSort>(PROCEDURE_SORTS, params.get('sort'), 'updatedAt');
  const dir = oneOf(['asc', 'desc'] as const, params.get('dir'), sort === 'updatedAt' ? 'desc' : 'asc');
  const size = Number(oneOf(PROCEDURE_PAGE_SIZES.map(String), params.get('size'), '50'));
  const page = Math.max(1, Math.floor(Number(params.get('page'))) || 1);
  const filters: Filters = {
    family: params.get('family') ?? '',
    tag: params.get('tag') ?? '',
    state: (params.get('state') ?? '') as RevisionStateName | '',
  };
  const q = params.get('q') ?? '';
  const update = (next: Record<string, string>) => {
    const merged = new URLSearchParams(params);
    for (const [k, v] of Object.entries(next)) {
      if (v) merged.set(k, v);
      else merged.delete(k);
    }
    setParams(merged, { replace: true });
  };
  return { sort, dir, size, page, filters, q, update };
}

export default function ProceduresPage() {
  const session = useSession();
  const { sort, dir, size, page, filters, q, update } = useListState();
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
  const query = useProcedures({
    q: q || undefined,
    family: filters.family || undefined,
    tag: filters.tag || undefined,
    state: filters.state || undefined,
    sort,
    dir,
    limit: size,
    offset: (page - 1) * size,
  });
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
      {query.isPending && <p className="text-graphite-soft">Loading…</p>}
      {query.isError && <Notice tone="error">{query.error.message}</Notice>}
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
              {data.total
                ? 'This page is past the end of the list.'
                : q
                  ? `No procedure title contains “${q}” with these filters.`
                  : 'No procedure matches these filters.'}
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
