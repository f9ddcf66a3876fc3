import { Link, useNavigate } from 'react-router-dom';
import type { RevisionView } from '@shared/schemas/procedures';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';
import { paths } from '@/config/paths';
import { useStartDraft } from '../api/start-draft';

/** What an author can do from a revision: edit a draft, or start the next draft from an approved one. */
export function RevisionActions({ revision, isAuthor }: { revision: RevisionView; isAuthor: boolean }) {
  const startDraft = useStartDraft();
  const navigate = useNavigate();
  const openRevision = startDraft.error?.body.revisionId;
  return (
    <div className="no-print flex flex-wrap items-center gap-2">
      {isAuthor && revision.state === 'draft' && (
        <Link
          to={paths.editRevision.href(revision.id)}
          className="inline-flex min-h-11 items-center rounded-md border border-accent-deep bg-accent px-4 text-sm font-semibold text-white hover:bg-accent-deep"
        >
          Edit
        </Link>
      )}
      {isAuthor && revision.state === 'approved' && (
        <Button
          disabled={startDraft.isPending}
          whyDisabled="Starting the draft…"
          onClick={() =>
            startDraft.mutate(revision.procedureId, {
              onSuccess: (d) => navigate(paths.editRevision.href(d.revision.id)),
            })
          }
        >
          Start a new draft
        </Button>
      )}
      <Link
        to={paths.procedure.href(revision.procedureId)}
        className="inline-flex min-h-11 items-center rounded-md border border-rule bg-card px-4 text-sm hover:bg-paper-deep"
      >
        All revisions
      </Link>
      <Button variant="quiet" onClick={() => window.print()}>
        Print
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
    </div>
  );
}
