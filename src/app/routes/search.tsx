import { useEffect, useState, type FormEvent } from 'react';
import { Link, useSearchParams } from 'react-router-dom';
import { Problem } from '@/components/errors/problem';
import { Pager } from '@/components/ui/pager';
import { paths } from '@/config/paths';
import { searchFromUrl, useSearch } from '@/features/search/api/search-procedures';
import { Snippet } from '@/features/search/components/snippet';

export default function SearchPage() {
  const [params, setParams] = useSearchParams();
  const searched = searchFromUrl(params);
  const { q, family = '', tag = '', page = 1, pageSize = 1 } = searched;
  const [text, setText] = useState(q);
  const search = useSearch(searched);

  useEffect(() => {
    setText(q);
    document.title = q ? `“${q}” · Search · Benchwright` : 'Search · Benchwright';
  }, [q]);

  const update = (next: Record<string, string>) => {
    const merged = new URLSearchParams(params);
    for (const [k, v] of Object.entries(next)) {
      if (v) merged.set(k, v);
      else merged.delete(k);
    }
    if (!('page' in next)) merged.delete('page');
    setParams(merged);
  };
  const submit = (e: FormEvent) => {
    e.preventDefault();
    update({ q: text.trim() });
  };
  const data = search.data;
  const pages = data ? Math.ceil(data.total / pageSize) : 0;

  return (
    <section className="flex flex-col gap-5">
      <h1 className="text-2xl font-semibold">Search approved procedures</h1>
      <form onSubmit={submit} className="flex gap-2" role="search">
        <label htmlFor="search-page-q" className="sr-only">
          Search words
        </label>
        <input
          id="search-page-q"
          type="search"
          value={text}
          onChange={(e) => setText(e.target.value)}
          className="min-h-11 flex-1 rounded-md border border-rule bg-card px-3"
          placeholder="e.g. TC-18 HT fuse, 47 µF cap, heater 6.3 V"
        />
        <button type="submit" className="min-h-11 rounded-md bg-accent px-4 font-semibold text-white">
          Search
        </button>
      </form>
      {data && (data.facets.families.length > 0 || data.facets.tags.length > 0) && (
        <div className="flex flex-wrap gap-4 text-sm">
          <label className="flex items-center gap-2">
            Equipment
            <select
              className="min-h-11 rounded-md border border-rule bg-card px-2"
              value={family}
              onChange={(e) => update({ family: e.target.value })}
            >
              <option value="">all</option>
              {data.facets.families.map((f) => (
                <option key={f}>{f}</option>
              ))}
            </select>
          </label>
          <label className="flex items-center gap-2">
            Tag
            <select
              className="min-h-11 rounded-md border border-rule bg-card px-2"
              value={tag}
              onChange={(e) => update({ tag: e.target.value })}
            >
              <option value="">all</option>
              {data.facets.tags.map((t) => (
                <option key={t}>{t}</option>
              ))}
            </select>
          </label>
        </div>
      )}
      {search.isError && <Problem error={search.error} heading="h2" onRetry={() => void search.refetch()} />}
      {!q && (
        <p className="text-graphite-soft">
          Type what you are looking for. Trade words work: HT or B+, heater or filament, slow-blow or T fuse,
          47uF or 47 µF.
        </p>
      )}
      {data && q && (
        <p className="text-sm text-graphite-soft" aria-live="polite">
          {data.total === 0
            ? 'No approved procedure matches.'
            : `${data.total} approved procedure${data.total === 1 ? '' : 's'}`}
          {data.total === 0 && data.suggestions.length > 0 && (
            <>
              {' '}
              Did you mean{' '}
              {data.suggestions.slice(0, 4).map((s, i) => (
                <span key={s}>
                  {i > 0 && ', '}
                  <button
                    type="button"
                    className="font-semibold text-accent underline"
                    onClick={() => update({ q: s })}
                  >
                    {s}
                  </button>
                </span>
              ))}
              ?
            </>
          )}
        </p>
      )}
      <ol className={`flex flex-col gap-3 ${search.isFetching ? 'opacity-70' : ''}`}>
        {data?.results.map((h) => (
          <li key={h.procedureId} className="rounded-lg border border-rule bg-card p-4">
            <Link
              to={paths.revision.href(h.revisionId)}
              className="text-lg font-semibold text-accent-deep underline-offset-2 hover:underline"
            >
              {h.title}
            </Link>
            <div className="text-xs text-graphite-soft">
              {h.family} · {h.model} · revision {h.revisionNumber} · {h.tags.join(', ')}
            </div>
            <p className="mt-2 text-sm">
              <Snippet parts={h.snippet} />
            </p>
          </li>
        ))}
      </ol>
      <Pager page={page} pages={pages} label="Result pages" onPage={(p) => update({ page: String(p) })} />
    </section>
  );
}
