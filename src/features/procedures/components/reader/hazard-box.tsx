import type { ReactNode } from 'react';
import { HazardTriangle } from '../hazard-triangle';

/** A hazard note in the reader: safety yellow, black border, the level in words. */
export function HazardBox({ level, children }: { level: 'danger' | 'warning'; children: ReactNode }) {
  return (
    <aside className="hazard-note not-prose my-4 flex gap-3 rounded-md border-4 border-hazard-ink bg-hazard p-4 text-hazard-ink" data-hazard={level}>
      <HazardTriangle className="size-10 shrink-0" />
      <div>
        <p className="text-sm font-bold uppercase tracking-wider">{level === 'danger' ? 'Danger' : 'Warning'}</p>
        <div className="font-semibold [&_p]:mt-1">{children}</div>
      </div>
    </aside>
  );
}
