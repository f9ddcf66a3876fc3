import type { RevisionView } from '@shared/schemas/procedures';
import { Button } from '@/components/ui/button';
import { compareDrafts } from './compare-drafts';
import { draftFromRevision, type DraftFields } from './draft-fields';

interface Props {
  message: string;
  mine: DraftFields;
  current: RevisionView;
  /** False when the revision is no longer a draft: only loading the saved version makes sense. */
  editable: boolean;
  onKeepMine: () => void;
  onLoadTheirs: () => void;
}

/** Both versions side by side after a 409; nothing is overwritten until the author chooses. */
export function ConflictPanel({ message, mine, current, editable, onKeepMine, onLoadTheirs }: Props) {
  const cmp = compareDrafts(mine, draftFromRevision(current));
  const column = (title: string, lines: { line: string; only: boolean }[]) => (
    <div className="min-w-0 flex-1">
      <h3 className="text-sm font-semibold">{title}</h3>
      <pre className="value mt-1 max-h-80 overflow-auto whitespace-pre-wrap rounded border border-rule bg-card p-2 text-xs">
        {lines.map((l, i) => (
          <span key={i} className={`block ${l.only ? 'bg-accent-wash font-semibold' : ''}`}>
            {l.only ? '» ' : '  '}
            {l.line || ' '}
          </span>
        ))}
      </pre>
    </div>
  );
  return (
    <section
      role="alertdialog"
      aria-labelledby="conflict-title"
      className="rounded-lg border-2 border-out bg-out-wash p-4"
    >
      <h2 id="conflict-title" className="text-lg font-semibold text-out">
        Two versions of this draft
      </h2>
      <p className="mt-1 text-sm">
        {message} The saved version is from {new Date(current.updatedAt).toLocaleString()}. Your version is
        kept on this device until you choose.
      </p>
      <ul className="mt-2 list-disc pl-5 text-sm">
        {cmp.summary.map((s) => (
          <li key={s}>{s}</li>
        ))}
      </ul>
      <div className="mt-3 flex flex-col gap-3 md:flex-row">
        {column('Your version', cmp.mine)}
        {column(
          `Saved version (revision ${current.number}, ${current.state === 'draft' ? 'draft' : current.state.replace('_', ' ')})`,
          cmp.theirs,
        )}
      </div>
      <p className="mt-2 text-xs text-graphite-soft">Lines marked » appear only on that side.</p>
      <div className="mt-3 flex flex-wrap gap-2">
        {editable && <Button onClick={onKeepMine}>Keep mine and save it</Button>}
        <Button variant="quiet" onClick={onLoadTheirs}>
          Load the saved version
        </Button>
      </div>
    </section>
  );
}
