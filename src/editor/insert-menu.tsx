import { useEffect, useId, useMemo, useRef, useState } from 'react';
import { filterCatalog, type CatalogEntry } from './block-catalog';

interface Props {
  entries: CatalogEntry[];
  /** Viewport position of the caret, so the list opens where the author is writing. */
  anchor: { top: number; left: number } | null;
  onChoose: (entry: CatalogEntry) => void;
  onClose: () => void;
}

/** The "Insert block" list: type to filter, arrow keys to move, Enter to insert, Escape to go back. */
export function InsertMenu({ entries, anchor, onChoose, onClose }: Props) {
  const [query, setQuery] = useState('');
  const [active, setActive] = useState(0);
  const input = useRef<HTMLInputElement>(null);
  const listId = useId();
  const shown = useMemo(() => filterCatalog(entries, query), [entries, query]);
  const current = shown[Math.min(active, shown.length - 1)];

  useEffect(() => input.current?.focus(), []);
  useEffect(() => setActive(0), [query]);
  useEffect(() => {
    document.getElementById(`${listId}-${current?.key}`)?.scrollIntoView({ block: 'nearest' });
  }, [current, listId]);

  const onKeyDown = (e: React.KeyboardEvent) => {
    if (e.key === 'ArrowDown') setActive((i) => Math.min(i + 1, shown.length - 1));
    else if (e.key === 'ArrowUp') setActive((i) => Math.max(i - 1, 0));
    else if (e.key === 'Home') setActive(0);
    else if (e.key === 'End') setActive(shown.length - 1);
    else if (e.key === 'Enter' && current) onChoose(current);
    else if (e.key === 'Escape' || e.key === 'Tab') onClose();
    else return;
    e.preventDefault();
  };

  const top = anchor ? Math.min(anchor.top + 8, window.innerHeight - 340) : 120;
  const left = anchor ? Math.min(anchor.left, window.innerWidth - 400) : 40;
  return (
    <div
      role="dialog"
      aria-label="Insert block"
      className="fixed z-30 flex w-96 max-w-[calc(100vw-1rem)] flex-col rounded-lg border border-graphite bg-card shadow-lg"
      style={{ top: Math.max(8, top), left: Math.max(8, left) }}
    >
      <input
        ref={input}
        role="combobox"
        aria-expanded="true"
        aria-controls={listId}
        aria-activedescendant={current ? `${listId}-${current.key}` : undefined}
        aria-label="Insert block: type to filter"
        placeholder="Insert block: type to filter…"
        className="m-2 min-h-10 rounded border border-rule bg-paper px-2 text-sm"
        value={query}
        onChange={(e) => setQuery(e.target.value)}
        onKeyDown={onKeyDown}
        onBlur={(e) => {
          if (!e.currentTarget.parentElement?.contains(e.relatedTarget)) onClose();
        }}
      />
      <ul id={listId} role="listbox" aria-label="Blocks" className="max-h-72 overflow-y-auto px-1 pb-2">
        {shown.length === 0 && (
          <li className="px-3 py-2 text-sm text-graphite-soft">Nothing matches “{query}”.</li>
        )}
        {shown.map((entry) => (
          <li
            key={entry.key}
            id={`${listId}-${entry.key}`}
            role="option"
            aria-selected={entry === current}
            className={`cursor-pointer rounded px-3 py-2 ${entry === current ? 'bg-accent text-white' : 'hover:bg-paper-deep'}`}
            onMouseDown={(e) => e.preventDefault()}
            onClick={() => onChoose(entry)}
          >
            <span className="block text-sm font-semibold">{entry.label}</span>
            <span className={`block text-xs ${entry === current ? 'text-white' : 'text-graphite-soft'}`}>
              {entry.hint}
            </span>
          </li>
        ))}
      </ul>
    </div>
  );
}
