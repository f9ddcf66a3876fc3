import type { Caution } from '@shared/reckoners';
import { signFor } from '@shared/safety-signs';
import { SignalWord } from '@/components/ui/safety-sign';

/** A reckoner's cautions, most serious first, each with its level spelled out (never colour alone). */
export function CautionList({ cautions }: { cautions: Caution[] }) {
  if (!cautions.length) return null;
  const order = { danger: 0, warning: 1, note: 2 } as const;
  const sorted = [...cautions].sort((a, b) => order[a.level] - order[b.level]);
  return (
    <ul className="flex flex-col gap-2" aria-label="Cautions">
      {sorted.map((c) => (
        <li
          key={c.code + c.message}
          data-caution={c.level}
          className="rounded border-2 bg-card px-3 py-2 text-sm text-graphite"
          style={{ borderColor: signFor(c.level).field }}
        >
          <SignalWord level={c.level} size="sm" /> {c.message}
          {c.source && <span className="block text-xs text-graphite-soft">Source: {c.source}</span>}
        </li>
      ))}
    </ul>
  );
}
