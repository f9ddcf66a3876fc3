import { useEffect, useId, useRef, useState, type KeyboardEvent } from 'react';
import { useNavigate } from 'react-router-dom';
import { paths } from '@/config/paths';
import { useSearch } from '../api/search-procedures';
import { Snippet } from './snippet';
import { useDebounced } from '@/hooks/use-debounced';

const isTyping = (el: EventTarget | null) =>
  el instanceof HTMLElement && (el.isContentEditable || ['INPUT', 'TEXTAREA', 'SELECT'].includes(el.tagName));

/**
 * The header search: "/" anywhere (outside a text field) jumps here; results appear as you type;
 * arrow keys choose, Enter opens, Enter with nothing chosen shows the full results page.
 */
export function SearchBox() {
  const [text, setText] = useState('');
  const [open, setOpen] = useState(false);
  const [active, setActive] = useState(-1);
  const input = useRef<HTMLInputElement>(null);
  const navigate = useNavigate();
  const listId = useId();
  const q = useDebounced(text.trim(), 150);
  const search = useSearch({ q, pageSize: 6 });
  const hits = q ? (search.data?.results ?? []) : [];

  useEffect(() => {
    const onKey = (e: globalThis.KeyboardEvent) => {
      if (e.key === '/' && !e.ctrlKey && !e.metaKey && !e.altKey && !isTyping(e.target)) {
        e.preventDefault();
        input.current?.focus();
      }
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, []);

  const go = (to: string) => {
    setOpen(false);
    setActive(-1);
    navigate(to);
  };

  const onKeyDown = (e: KeyboardEvent<HTMLInputElement>) => {
    if (e.key === 'ArrowDown') {
      e.preventDefault();
      setOpen(true);
      setActive((a) => Math.min(a + 1, hits.length - 1));
    } else if (e.key === 'ArrowUp') {
      e.preventDefault();
      setActive((a) => Math.max(a - 1, -1));
    } else if (e.key === 'Enter') {
      e.preventDefault();
      const chosen = hits[active];
      if (chosen) go(paths.revision.href(chosen.revisionId));
      else if (text.trim()) go(paths.search.href(text.trim()));
    } else if (e.key === 'Escape') {
      setOpen(false);
      input.current?.blur();
    }
  };

  return (
    <div className="relative w-full max-w-64 min-w-48 flex-1" role="search">
      <label htmlFor={`${listId}-input`} className="sr-only">
        Search approved procedures
      </label>
      <input
        ref={input}
        id={`${listId}-input`}
        type="search"
        role="combobox"
        aria-expanded={open && hits.length > 0}
        aria-controls={listId}
        aria-activedescendant={active >= 0 ? `${listId}-${active}` : undefined}
        aria-autocomplete="list"
        placeholder="Search procedures  ( / )"
        className="min-h-11 w-full rounded-md border border-rule bg-card px-3 py-2 text-sm"
        value={text}
        onChange={(e) => {
          setText(e.target.value);
          setOpen(true);
          setActive(-1);
        }}
        onFocus={() => setOpen(true)}
        onBlur={() => setTimeout(() => setOpen(false), 150)}
        onKeyDown={onKeyDown}
      />
      {open && q && (
        <div className="absolute left-0 right-0 top-full z-20 mt-1 rounded-md border border-rule bg-card shadow-lg">
          {search.isError && <p className="p-3 text-sm text-out">{search.error.message}</p>}
          {search.data && hits.length === 0 && (
            <p className="p-3 text-sm text-graphite-soft">
              No approved procedure matches all of “{q}”.
              {search.data.suggestions.length > 0 && (
                <> Try: {search.data.suggestions.slice(0, 3).join(', ')}.</>
              )}
            </p>
          )}
          {search.data?.correctedQuery && hits.length > 0 && (
            <p className="px-3 pt-2 text-xs text-graphite-soft">
              Showing results for “{search.data.correctedQuery}”
            </p>
          )}
          <ul
            id={listId}
            role="listbox"
            aria-label="Search results"
            className={search.isFetching ? 'opacity-70' : ''}
          >
            {hits.map((h, i) => (
              <li
                key={h.procedureId}
                id={`${listId}-${i}`}
                role="option"
                aria-selected={i === active}
                className={`cursor-pointer border-b border-rule px-3 py-2 text-sm last:border-0 ${i === active ? 'bg-accent-wash' : 'hover:bg-paper'}`}
                onMouseDown={(e) => e.preventDefault()}
                onClick={() => go(paths.revision.href(h.revisionId))}
              >
                <div className="font-semibold">{h.title}</div>
                <div className="text-xs text-graphite-soft">
                  {h.family} · {h.model} · revision {h.revisionNumber}
                </div>
                <div className="mt-1 line-clamp-2 text-xs">
                  <Snippet parts={h.snippet} />
                </div>
              </li>
            ))}
          </ul>
          {search.data?.partial && hits.length === 0 && (
            <button
              type="button"
              className="w-full px-3 py-2 text-left text-sm font-semibold text-accent underline"
              onMouseDown={(e) => e.preventDefault()}
              onClick={() => go(paths.search.href(q))}
            >
              {search.data.partial.total} that match some of your words
            </button>
          )}
          {search.data && search.data.total > hits.length && (
            <button
              type="button"
              className="w-full px-3 py-2 text-left text-sm font-semibold text-accent underline"
              onMouseDown={(e) => e.preventDefault()}
              onClick={() => go(paths.search.href(q))}
            >
              All {search.data.total} results
            </button>
          )}
        </div>
      )}
    </div>
  );
}
