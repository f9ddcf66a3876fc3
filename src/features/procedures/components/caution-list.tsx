import type { Caution } from '@shared/reckoners';

/** The signal word and colours of each level: one definition for cautions and the procedure check. */
export const LEVEL: Record<Caution['level'], { word: string; style: string }> = {
  danger: { word: 'Danger', style: 'border-hazard-ink bg-hazard text-hazard-ink' },
  warning: { word: 'Warning', style: 'border-out bg-out-wash text-graphite' },
  note: { word: 'Note', style: 'border-rule bg-paper text-graphite' },
};

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
          className={`rounded border-2 px-3 py-2 text-sm ${LEVEL[c.level].style}`}
        >
          <strong>{LEVEL[c.level].word}:</strong> {c.message}
          {c.source && <span className="block text-xs opacity-80">Source: {c.source}</span>}
        </li>
      ))}
    </ul>
  );
}
