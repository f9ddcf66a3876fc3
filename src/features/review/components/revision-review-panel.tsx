import { lazy, Suspense } from 'react';
import { Link } from 'react-router-dom';
import type { RevisionView } from '@shared/schemas/procedures';
import { RegionBoundary } from '@/components/errors/region-boundary';
import { paths } from '@/config/paths';
import { Notice } from '@/components/ui/notice';
import { hasRole, useSession } from '@/features/auth/api/get-session';
import { useSubmitRevision } from '../api/review-mutations';
import { SignatureList } from './signature-list';

type PanelRevision = Pick<RevisionView, 'id' | 'procedureId' | 'number' | 'state' | 'lockVersion'>;

// Only authors (a draft) and reviewers (an approved revision) see these forms: loaded for them alone.
const SubmitForReview = lazy(() =>
  import('./revision-review-actions').then((m) => ({ default: m.SubmitForReview })),
);
const WithdrawProcedure = lazy(() =>
  import('./revision-review-actions').then((m) => ({ default: m.WithdrawProcedure })),
);

/**
 * Review status and actions beside a revision: its sign-offs (verified on each read), submitting a
 * draft, a link to the review page, and withdrawing an approved procedure.
 */
export function RevisionReviewPanel({ revision }: { revision: PanelRevision }) {
  const user = useSession().data?.user;
  const submit = useSubmitRevision(revision.id);
  const problems =
    (submit.error?.body.problems as { blockId: string | null; message: string }[] | undefined) ?? [];
  const reviewLink = paths.reviewRevision.href(revision.id);
  const seesReview = hasRole(user, 'author', 'reviewer', 'admin');

  return (
    <section aria-label="Review and sign-off" className="flex flex-col gap-3">
      <RegionBoundary label="Sign-offs">
        <SignatureList revisionId={revision.id} />
      </RegionBoundary>
      <div className="flex flex-wrap items-center gap-3">
        {revision.state === 'draft' && hasRole(user, 'author') && (
          <Suspense fallback={null}>
            <SubmitForReview revision={revision} submit={submit} />
          </Suspense>
        )}
        {revision.state === 'in_review' && seesReview && (
          <Link to={reviewLink} className="font-semibold text-accent underline">
            {hasRole(user, 'reviewer') ? 'Open the review' : 'Review page and comments'}
          </Link>
        )}
        {['returned', 'approved', 'superseded', 'withdrawn'].includes(revision.state) && seesReview && (
          <Link to={reviewLink} className="text-sm text-accent underline">
            What changed, comments and sign-offs
          </Link>
        )}
        {revision.state === 'approved' && user && hasRole(user, 'reviewer', 'admin') && (
          <Suspense fallback={null}>
            <WithdrawProcedure revision={revision} signerName={user.displayName} />
          </Suspense>
        )}
      </div>
      {submit.isSuccess && <Notice tone="success">Submitted. The reviewers have been told by e-mail.</Notice>}
      {submit.error && !submit.error.fields.length && (
        <Notice tone="error">
          {problems.length ? `Revision ${revision.number} cannot go to review yet:` : submit.error.message}
          {problems.length > 0 && (
            <ul className="mt-1 list-disc pl-5">
              {problems.map((p, i) => (
                <li key={i}>{p.message}</li>
              ))}
            </ul>
          )}
        </Notice>
      )}
    </section>
  );
}
