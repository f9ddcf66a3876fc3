import { useEffect, useState, type FormEvent } from 'react';
import { Link, useSearchParams } from 'react-router-dom';
import { paths } from '@/config/paths';
import { Problem } from '@/components/errors/problem';
import { Pager } from '@/components/ui/pager';
import { searchFromUrl, useSearch } from '@/features/search/api/search-procedures';
import { ResultList } from '@/features/search/components/result-list';

/** No full match: the library's nearest spellings as links, and where else to look. */
function NothingFound({ suggestions, partial }: { suggestions: string[]; partial: boolean }) {
  return (
    <div data-search-empty className="flex flex-col gap-1">
      <p className="text-graphite-soft">No approved procedure matches all of your words.</p>
      {suggestions.length > 0 && (
        <p>
          Did you mean{' '}
          {suggestions.slice(0, 4).map((s, i) => (
            <span key={s}>
              {i > 0 && ', '}
              <Link to={paths.search.href(s)} className="font-semibold text-accent underline">
                {s}
              </Link>
            </span>
          ))}
          ?
        </p>
      )}
      <p>
        {partial ? 'Below are procedures that mention some of them. ' : ''}Try fewer or other words (trade
        words work: HT or B+, heater or filament), or{' '}
        <Link to={paths.procedures.href()} className="font-semibold text-accent underline">
          browse every procedure
        </Link>
        .
      </p>
    </div>
  );
}

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
  const pages = data ? Math.ceil((data.partial?.total ?? data.total) / pageSize) : 0;

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
        <div className="flex flex-col gap-1 text-sm" aria-live="polite">
          {data.correctedQuery && (
            <p>
              No approved procedure uses the words you typed; showing results for{' '}
              <strong>{data.correctedQuery}</strong>.
            </p>
          )}
          {data.total === 0 ? (
            <NothingFound suggestions={data.suggestions} partial={!!data.partial} />
          ) : (
            <p className="text-graphite-soft">
              {data.total} approved procedure{data.total === 1 ? '' : 's'} match
              {data.total === 1 ? 'es' : ''} all of your words
            </p>
          )}
        </div>
      )}
      {data && data.results.length > 0 && (
        <ResultList
          hits={data.results}
          label="Procedures matching all of your words"
          dim={search.isFetching}
        />
      )}
      {data?.partial && (
        <section aria-labelledby="search-partial" className="flex flex-col gap-3">
          <h2 id="search-partial" className="text-lg font-semibold">
            {data.partial.label}
          </h2>
          <p className="text-sm text-graphite-soft">
            {data.partial.total} approved procedure{data.partial.total === 1 ? '' : 's'} mention
            {data.partial.total === 1 ? 's' : ''} only some of the words. None of them is an answer to the
            whole question; read each before relying on it.
          </p>
          <ResultList hits={data.partial.results} label={data.partial.label} dim={search.isFetching} />
        </section>
      )}
      <Pager page={page} pages={pages} label="Result pages" onPage={(p) => update({ page: String(p) })} />
    </section>
  );
}
