import { Link } from 'react-router-dom';
import type { RevisionView } from '@shared/schemas/procedures';
import { Button } from '@/components/ui/button';
import { paths } from '@/config/paths';
import { StartDraftButton } from './start-draft-button';

/** What an author can do from a revision: edit a draft, or start the next draft from an approved or returned one. */
export function RevisionActions({ revision, isAuthor }: { revision: RevisionView; isAuthor: boolean }) {
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
      {isAuthor && <StartDraftButton revision={revision} />}
      <Link
        to={paths.procedure.href(revision.procedureId)}
        className="inline-flex min-h-11 items-center rounded-md border border-rule bg-card px-4 text-sm hover:bg-paper-deep"
      >
        All revisions
      </Link>
      <Button variant="quiet" onClick={() => window.print()}>
        Print
      </Button>
    </div>
  );
}
