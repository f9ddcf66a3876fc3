import type { ReactNode } from 'react';
import { HazardTriangle } from '../hazard-triangle';

/** A hazard note in the reader: safety yellow, black border, the level in words, then the live-work cautions it states. */
export function HazardBox({
  level,
  flags = [],
  children,
}: {
  level: 'danger' | 'warning';
  flags?: string[];
  children: ReactNode;
}) {
  return (
    <aside
      className="hazard-note not-prose my-4 flex gap-3 rounded-md border-4 border-hazard-ink bg-hazard p-4 text-hazard-ink"
      data-hazard={level}
    >
      <HazardTriangle className="size-10 shrink-0" />
      <div>
        <p className="text-sm font-bold uppercase tracking-wider">
          {level === 'danger' ? 'Danger' : 'Warning'}
        </p>
        {flags.length > 0 && (
          <ul className="mt-1 flex flex-wrap gap-1 text-xs font-bold" aria-label="Live-work cautions">
            {flags.map((f) => (
              <li key={f} className="rounded border-2 border-hazard-ink px-1.5 py-0.5">
                {f}
              </li>
            ))}
          </ul>
        )}
        <div className="font-semibold [&_p]:mt-1">{children}</div>
      </div>
    </aside>
  );
}
