import { REVISION_STATE_LABELS, type RevisionView } from '@shared/schemas/procedures';
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
  const differences = compareDrafts(mine, draftFromRevision(current));
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
      {differences.length ? (
        <div className="mt-3 max-h-96 overflow-auto rounded border border-rule bg-card" tabIndex={0}>
          <table className="w-full text-left text-sm">
            <caption className="sr-only">What differs between your version and the saved one</caption>
            <thead className="border-b border-rule text-xs text-graphite-soft">
              <tr>
                <th scope="col" className="px-3 py-1 font-normal">
                  Field
                </th>
                <th scope="col" className="px-3 py-1 font-normal">
                  Yours
                </th>
                <th scope="col" className="px-3 py-1 font-normal">
                  Saved (revision {current.number}, {REVISION_STATE_LABELS[current.state].toLowerCase()})
                </th>
              </tr>
            </thead>
            <tbody>
              {differences.map((d) => (
                <tr
                  key={d.label}
                  data-field={d.label}
                  className="border-b border-rule align-top last:border-0"
                >
                  <th scope="row" className="px-3 py-1 font-semibold">
                    {d.label}
                  </th>
                  <td className="whitespace-pre-wrap break-words px-3 py-1">{d.yours}</td>
                  <td className="whitespace-pre-wrap break-words px-3 py-1">{d.saved}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      ) : (
        <p className="mt-2 text-sm">Both versions hold the same details, figures and text.</p>
      )}
      <div className="mt-3 flex flex-wrap gap-2">
        {editable && <Button onClick={onKeepMine}>Keep mine and save it</Button>}
        <Button variant="quiet" onClick={onLoadTheirs}>
          Load the saved version
        </Button>
      </div>
    </section>
  );
}
