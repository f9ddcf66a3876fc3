import type { LintWarning } from '@shared/document/lint';

/** The procedure check beside the editor: each warning jumps to its block. Warnings never stop a save. */
export function ProcedureCheckPanel({ warnings, onSelect }: { warnings: LintWarning[]; onSelect: (blockId: string) => void }) {
  return (
    <section aria-labelledby="check-title" className="rounded-lg border border-rule bg-card p-3">
      <h2 id="check-title" className="text-sm font-semibold">
        Procedure check{' '}
        <span className="value font-normal text-graphite-soft">
          ({warnings.length} {warnings.length === 1 ? 'warning' : 'warnings'})
        </span>
      </h2>
      {warnings.length === 0 ? (
        <p className="mt-2 text-sm text-graphite-soft">No warnings. A reviewer still checks every value.</p>
      ) : (
        <ul className="mt-2 flex flex-col gap-2" data-procedure-check>
          {warnings.map((w, i) => (
            <li key={`${w.code}-${w.blockId}-${i}`}>
              {w.blockId ? (
                <button
                  type="button"
                  className="w-full rounded border border-rule bg-paper px-2 py-2 text-left text-sm hover:border-accent hover:bg-accent-wash"
                  onClick={() => onSelect(w.blockId!)}
                >
                  {w.message} <span className="text-xs text-accent-deep underline">Go to block</span>
                </button>
              ) : (
                <p className="rounded border border-rule bg-paper px-2 py-2 text-sm">{w.message}</p>
              )}
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}
