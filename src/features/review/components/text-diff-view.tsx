import type { DiffLine } from '@shared/schemas/review';

const LINE_STYLE: Record<DiffLine['kind'], string> = {
  same: '',
  changed: 'bg-paper-deep',
  added: 'bg-accent-wash',
  removed: 'bg-out-wash',
};
const MARK: Record<DiffLine['kind'], string> = { same: ' ', changed: '~', added: '+', removed: '−' };

/** The plain text of the revision against the base, changed words marked inline. Unchanged runs fold. */
export function TextDiffView({ lines }: { lines: DiffLine[] }) {
  if (!lines.some((l) => l.kind !== 'same'))
    return <p className="text-sm text-graphite-soft">The text is unchanged.</p>;
  // Keep two lines of context around each change; fold the rest.
  const keep = lines.map((_, i) => lines.slice(Math.max(0, i - 2), i + 3).some((l) => l.kind !== 'same'));
  const rows: (DiffLine | { fold: number })[] = [];
  lines.forEach((l, i) => {
    if (keep[i]) rows.push(l);
    else {
      const last = rows[rows.length - 1];
      if (last && 'fold' in last) last.fold++;
      else rows.push({ fold: 1 });
    }
  });
  return (
    <div
      aria-label="Text changes"
      role="region"
      className="rounded-lg border border-rule bg-card font-serif text-sm"
    >
      {rows.map((row, i) =>
        'fold' in row ? (
          <p key={i} className="border-y border-rule px-3 py-1 text-xs text-graphite-soft">
            {row.fold} unchanged line{row.fold === 1 ? '' : 's'}
          </p>
        ) : (
          <p key={i} data-diff-line={row.kind} className={`flex gap-3 px-3 py-1 ${LINE_STYLE[row.kind]}`}>
            <span aria-hidden className="value w-3 select-none text-graphite-soft">
              {MARK[row.kind]}
            </span>
            <span className="min-w-0 whitespace-pre-wrap break-words">
              {row.parts.map((p, j) =>
                p.op === 'add' ? (
                  <ins
                    key={j}
                    className="rounded-sm bg-accent-wash px-0.5 font-semibold text-accent-deep no-underline"
                  >
                    {p.text}
                  </ins>
                ) : p.op === 'del' ? (
                  <del key={j} className="bg-out-wash text-out">
                    {p.text}
                  </del>
                ) : (
                  <span key={j}>{p.text}</span>
                ),
              )}
            </span>
          </p>
        ),
      )}
    </div>
  );
}
