import { useEffect, useState } from 'react';
import { Link } from 'react-router-dom';
import type { RevisionView } from '@shared/schemas/procedures';
import { submitBody } from '@shared/schemas/review';
import { TextareaField } from '@/components/ui/field';
import { showServerError, useZodForm } from '@/lib/form';
import { RegionBoundary } from '@/components/errors/region-boundary';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';
import { paths } from '@/config/paths';
import { hasRole, useSession } from '@/features/auth/api/get-session';
import { useSubmitRevision, useWithdrawProcedure } from '../api/review-mutations';
import { SignatureList } from './signature-list';
import { SignOffDialog, signOffSchemas } from './sign-off-dialog';

type PanelRevision = Pick<RevisionView, 'id' | 'procedureId' | 'number' | 'state' | 'lockVersion'>;

/**
 * Review status and actions beside a revision: its sign-offs (verified on each read), submitting a
 * draft, a link to the review page, and withdrawing an approved procedure.
 */
export function RevisionReviewPanel({ revision }: { revision: PanelRevision }) {
  const user = useSession().data?.user;
  const submit = useSubmitRevision(revision.id);
  const submitForm = useZodForm(submitBody, {
    defaultValues: { changeReason: '', lockVersion: revision.lockVersion },
  });
  useEffect(() => {
    if (submit.error?.fields.length) showServerError(submitForm, submit.error);
  }, [submit.error, submitForm]);
  const withdraw = useWithdrawProcedure(revision.procedureId);
  const [withdrawing, setWithdrawing] = useState(false);
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
          <form
            noValidate
            className="flex w-full max-w-xl flex-col gap-2"
            onSubmit={submitForm.handleSubmit((v) =>
              submit.mutate({ changeReason: v.changeReason, lockVersion: revision.lockVersion }),
            )}
          >
            <TextareaField
              label="Change reason"
              hint="Why this revision was made, in a sentence: reviewers, technicians and every run sheet from it show it."
              error={submitForm.formState.errors.changeReason?.message}
              {...submitForm.register('changeReason')}
            />
            <Button type="submit" disabled={submit.isPending} className="self-start">
              {submit.isPending ? 'Submitting…' : 'Submit for review'}
            </Button>
          </form>
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
        {revision.state === 'approved' && hasRole(user, 'reviewer', 'admin') && (
          <Button variant="danger" onClick={() => setWithdrawing(true)}>
            Withdraw procedure…
          </Button>
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
      {user && (
        <SignOffDialog
          open={withdrawing}
          title={`Withdraw revision ${revision.number} from use`}
          meaning="withdrawn — technicians can no longer run it"
          signerName={user.displayName}
          commentLabel="Reason"
          schema={signOffSchemas.withdraw}
          commentField="reason"
          confirmLabel="Sign and withdraw"
          pending={withdraw.isPending}
          error={withdraw.error}
          onConfirm={(v) =>
            withdraw.mutate(
              { password: v.password, reason: v.comment },
              { onSuccess: () => setWithdrawing(false) },
            )
          }
          onClose={() => {
            setWithdrawing(false);
            withdraw.reset();
          }}
        />
      )}
    </section>
  );
}
