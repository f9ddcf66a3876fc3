import { useEffect, useState } from 'react';
import { Link, useParams } from 'react-router-dom';
import { REVISION_STATE_LABELS } from '@shared/schemas/procedures';
import { Button } from '@/components/ui/button';
import { RegionBoundary } from '@/components/errors/region-boundary';
import { paths } from '@/config/paths';
import { hasRole, useSession } from '@/features/auth/api/get-session';
import { useRevisionReview } from '@/features/review/api/review-queries';
import { useDecideRevision, type Decision } from '@/features/review/api/review-mutations';
import { CommentForm, CommentList } from '@/features/review/components/comments';
import { formatUtc } from '@/features/review/components/format';
import { RevisionReviewPanel } from '@/features/review/components/revision-review-panel';
import { SignOffDialog, signOffSchemas } from '@/features/review/components/sign-off-dialog';
import { TextDiffView } from '@/features/review/components/text-diff-view';
import { ChangeReason } from '@/features/review/components/change-reason';
import { ChangedPictures } from '@/features/review/components/changed-pictures';
import { FirstRevisionTable, ValueChangesTable } from '@/features/review/components/value-changes-table';
import { useRevision } from '@/features/procedures/api/get-revision';
import { DocumentView } from '@/features/procedures/components/reader/document-view';
import { Loading } from '@/components/ui/loading';

/** The revision rendered as the revision page renders it: the same reader, so blocks look the same. */
function WrittenRevision({ revisionId }: { revisionId: string }) {
  const query = useRevision(revisionId);
  const r = query.data?.revision;
  if (!r) {
    if (query.isError) throw query.error;
    return <Loading />;
  }
  return <DocumentView doc={r.document} snapshot={r.snapshot} reckoners={r.reckoners} />;
}

/** One revision under review: what changed against the last approved revision, comments, the signed decision. */
export default function ReviewRevisionPage() {
  const { revisionId = '' } = useParams();
  const user = useSession().data?.user;
  const query = useRevisionReview(revisionId);
  const decide = useDecideRevision(revisionId);
  const [deciding, setDeciding] = useState<Decision | null>(null);
  const v = query.data?.review;
  useEffect(() => {
    document.title = `Review: ${v?.revision.title ?? 'revision'} · Benchwright`;
  }, [v?.revision.title]);

  if (!v) {
    if (query.isError) throw query.error;
    return <Loading />;
  }
  const r = v.revision;
  const closeDialog = () => {
    setDeciding(null);
    decide.reset();
  };

  return (
    <article className="mx-auto flex max-w-7xl flex-col gap-6">
      <header className="flex flex-col gap-2 border-b border-rule pb-4">
        <p className="text-sm text-graphite-soft">
          Review · {r.equipmentFamily} ·{' '}
          <span className="font-semibold text-graphite">{r.equipmentModel}</span>
        </p>
        <h1 className="text-3xl font-semibold">{r.title}</h1>
        <p className="flex flex-wrap gap-x-4 gap-y-1 text-sm">
          <span>
            Revision <span className="value">{r.number}</span>
          </span>
          <span data-state={r.state} className="font-semibold">
            {REVISION_STATE_LABELS[r.state]}
          </span>
          <span>by {r.author.displayName}</span>
          {r.editors.length > 0 && <span>edited by {r.editors.map((e) => e.displayName).join(', ')}</span>}
          {r.submittedAt && <span>submitted {formatUtc(r.submittedAt)}</span>}
          <Link to={paths.revision.href(r.id)} className="text-accent underline">
            Read the whole revision
          </Link>
        </p>
        <p className="text-sm">
          {v.base ? (
            <>
              Compared with{' '}
              <Link to={paths.revision.href(v.base.id)} className="text-accent underline">
                revision {v.base.number}
              </Link>{' '}
              ({REVISION_STATE_LABELS[v.base.state].toLowerCase()}).
            </>
          ) : (
            'First revision: nothing to compare with. Below is what it assumes and what follows from it.'
          )}
        </p>
        <ChangeReason reason={r.changeReason} />
      </header>

      <RegionBoundary label="Review and sign-offs">
        <RevisionReviewPanel
          revision={{
            id: r.id,
            procedureId: r.procedureId,
            number: r.number,
            state: r.state,
            lockVersion: r.lockVersion,
          }}
        />
      </RegionBoundary>

      {hasRole(user, 'reviewer') && (
        <section
          aria-label="Decision"
          className="flex flex-col gap-2 rounded-lg border border-rule bg-paper-deep p-4"
        >
          <h2 className="text-lg font-semibold">Decision</h2>
          {v.canDecide ? (
            <>
              <p className="text-sm">
                Approving records that you, a qualified reviewer, checked this revision. It does not make the
                procedure safe; the bench cautions still apply.
              </p>
              <div className="flex flex-wrap gap-2">
                <Button onClick={() => setDeciding('approve')}>Approve…</Button>
                <Button variant="danger" onClick={() => setDeciding('return')}>
                  Return with comments…
                </Button>
              </div>
            </>
          ) : (
            <p className="text-sm text-graphite-soft">{v.cannotDecideReason}</p>
          )}
        </section>
      )}

      {v.base && (
        <RegionBoundary label="Pictures of the changed calculations">
          <ChangedPictures base={v.base} revision={r} changes={v.valueChanges} />
        </RegionBoundary>
      )}

      <div className="grid grid-cols-1 gap-6 lg:grid-cols-2 lg:items-start">
        <div className="flex min-w-0 flex-col gap-6">
          {v.base ? (
            <section className="flex flex-col gap-2">
              <h2 className="text-xl font-semibold">Changed values</h2>
              <ValueChangesTable changes={v.valueChanges} />
            </section>
          ) : (
            <section className="flex flex-col gap-2">
              <h2 className="text-xl font-semibold">What this revision assumes</h2>
              <p className="text-sm text-graphite-soft">
                Every input given and where it came from, then each calculation’s key results, in the author’s
                order.
              </p>
              <FirstRevisionTable rows={v.valueChanges} />
            </section>
          )}

          <section className="flex flex-col gap-2">
            <h2 className="text-xl font-semibold">Changed text</h2>
            <RegionBoundary label="Changed text">
              <TextDiffView lines={v.textDiff} />
            </RegionBoundary>
          </section>

          <section className="flex flex-col gap-3">
            <h2 className="text-xl font-semibold">Comments</h2>
            <RegionBoundary label="Comments">
              <CommentList comments={v.comments} />
              {hasRole(user, 'author', 'reviewer') && <CommentForm revisionId={r.id} blocks={v.blocks} />}
            </RegionBoundary>
          </section>
        </div>
        <section
          aria-labelledby="review-as-written"
          // Beside the changes (after them on a phone); on a wide screen it scrolls on its own, so it
          // takes the focus for the keyboard to scroll it.
          tabIndex={0}
          className="reader flex min-w-0 flex-col gap-2 rounded-lg border border-rule bg-paper p-4 lg:sticky lg:top-4 lg:max-h-[calc(100vh-2rem)] lg:overflow-y-auto"
        >
          <h2 id="review-as-written" className="text-xl font-semibold">
            Revision {r.number} as written
          </h2>
          <RegionBoundary label="The revision as written">
            <WrittenRevision revisionId={r.id} />
          </RegionBoundary>
        </section>
      </div>

      {user && (
        <SignOffDialog
          open={deciding !== null}
          title={
            deciding === 'approve'
              ? `Approve revision ${r.number}`
              : `Return revision ${r.number} to ${r.author.displayName}`
          }
          meaning={deciding === 'approve' ? 'approved for use at the bench' : 'returned for changes'}
          signerName={user.displayName}
          commentLabel={deciding === 'approve' ? 'Comment' : 'What needs to change'}
          schema={signOffSchemas[deciding ?? 'approve']}
          confirmLabel={deciding === 'approve' ? 'Sign and approve' : 'Sign and return'}
          pending={decide.isPending}
          error={decide.error}
          onConfirm={({ password, comment }) =>
            deciding &&
            decide.mutate({ decision: deciding, password, comment }, { onSuccess: () => setDeciding(null) })
          }
          onClose={closeDialog}
        />
      )}
    </article>
  );
}
