import type { LintWarning } from '@shared/document/lint';
import { SignalWord } from '@/components/ui/safety-sign';

const ORDER = { danger: 0, warning: 1, note: 2 } as const;

/**
 * Safety signs are for hazards only: a reckoner's caution and a finding of a safety rule (a missing
 * hazard note or discharge step, an under-rated capacitor: the rules at DANGER) carry their sign; a
 * finding about the document's data (a missing input, a reading without a band) is not a hazard and
 * gets the app's own mark.
 */
const isHazard = (w: LintWarning) => w.code === 'reckoner-caution' || w.level === 'danger';

function FindingMark({ warning }: { warning: LintWarning }) {
  if (isHazard(warning)) return <SignalWord level={warning.level} size="sm" />;
  return (
    <span className="inline-flex rounded-sm border border-out px-1.5 py-0.5 text-xs font-bold tracking-wider text-out">
      TO FIX
    </span>
  );
}

function WarningList({
  warnings,
  onSelect,
  label,
}: {
  warnings: LintWarning[];
  onSelect: (blockId: string) => void;
  label: string;
}) {
  const sorted = [...warnings].sort((a, b) => ORDER[a.level] - ORDER[b.level]);
  return (
    <ul className="mt-2 flex flex-col gap-2" data-procedure-check aria-label={label}>
      {sorted.map((w, i) => {
        const body = (
          <>
            <FindingMark warning={w} /> {w.message}
          </>
        );
        return (
          <li key={`${w.code}-${w.blockId}-${i}`} data-check-code={w.code} data-check-level={w.level}>
            {w.blockId ? (
              <button
                type="button"
                className="w-full rounded border border-rule bg-paper px-2 py-2 text-left text-sm hover:border-accent hover:bg-accent-wash"
                onClick={() => onSelect(w.blockId!)}
              >
                {body} <span className="text-xs text-accent-deep underline">Go to block</span>
              </button>
            ) : (
              <p className="rounded border border-rule bg-paper px-2 py-2 text-sm">{body}</p>
            )}
          </li>
        );
      })}
    </ul>
  );
}

/**
 * The procedure check beside the editor: its own findings first, then the reckoners' cautions it
 * passes on; each jumps to its block. Warnings never stop a save, and none does not mean safe.
 */
export function ProcedureCheckPanel({
  warnings,
  onSelect,
}: {
  warnings: LintWarning[];
  onSelect: (blockId: string) => void;
}) {
  const findings = warnings.filter((w) => w.code !== 'reckoner-caution');
  const cautions = warnings.filter((w) => w.code === 'reckoner-caution');
  return (
    <section aria-labelledby="check-title" className="rounded-lg border border-rule bg-card p-3">
      <h2 id="check-title" className="text-sm font-semibold">
        Procedure check{' '}
        <span className="value font-normal text-graphite-soft">
          ({findings.length} {findings.length === 1 ? 'warning' : 'warnings'})
        </span>
      </h2>
      {findings.length === 0 ? (
        <p className="mt-2 text-sm text-graphite-soft">No warnings. A reviewer still checks every value.</p>
      ) : (
        <WarningList warnings={findings} onSelect={onSelect} label="Procedure check warnings" />
      )}
      {cautions.length > 0 && (
        <details className="mt-3" open>
          <summary className="cursor-pointer text-sm font-semibold">
            Reckoner cautions{' '}
            <span className="value font-normal text-graphite-soft">({cautions.length})</span>
          </summary>
          <WarningList warnings={cautions} onSelect={onSelect} label="Reckoner cautions" />
        </details>
      )}
    </section>
  );
}
