import { Link, useNavigate } from 'react-router-dom';
import type { RevisionStateName } from '@shared/schemas/procedures';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';
import { paths } from '@/config/paths';
import { useStartDraft } from '../api/start-draft';

/**
 * An author carries on from an approved or returned revision: a new draft copied from it, opened in
 * the editor; a refusal (another draft already open) links to that draft.
 */
export function StartDraftButton({
  revision,
}: {
  revision: { id: string; procedureId: string; number: number; state: RevisionStateName };
}) {
  const startDraft = useStartDraft();
  const navigate = useNavigate();
  const openRevision = startDraft.error?.body.revisionId;
  if (revision.state !== 'approved' && revision.state !== 'returned') return null;
  return (
    <>
      <Button
        disabled={startDraft.isPending}
        onClick={() =>
          startDraft.mutate(
            { procedureId: revision.procedureId, fromRevisionId: revision.id },
            { onSuccess: (d) => navigate(paths.editRevision.href(d.revision.id)) },
          )
        }
      >
        {revision.state === 'returned' ? 'Start a new draft from this' : 'Start a new draft'}
        {/* Which revision, for a screen reader reaching the button from a list of them. */}
        <span className="sr-only"> (revision {revision.number})</span>
      </Button>
      {startDraft.error && (
        <Notice tone="error">
          {startDraft.error.message}{' '}
          {typeof openRevision === 'string' && (
            <Link className="underline" to={paths.editRevision.href(openRevision)}>
              Open that draft
            </Link>
          )}
        </Notice>
      )}
    </>
  );
}
