import type { ReactNode } from 'react';
import type { SignalLevel } from '@shared/safety-signs';
import { SafetySign } from '@/components/ui/safety-sign';

/** A hazard note in the reader: the safety sign of its level, then the live-work cautions it states. */
export function HazardBox({
  level,
  flags = [],
  children,
}: {
  level: SignalLevel;
  flags?: string[];
  children: ReactNode;
}) {
  return (
    <SafetySign level={level} className="hazard-note my-4">
      {flags.length > 0 && (
        <ul className="mb-1 flex flex-wrap gap-1 text-xs font-bold" aria-label="Live-work cautions">
          {flags.map((f) => (
            <li key={f} className="rounded border-2 border-graphite px-1.5 py-0.5">
              {f}
            </li>
          ))}
        </ul>
      )}
      <div className="font-semibold [&_p]:mt-1">{children}</div>
    </SafetySign>
  );
}
