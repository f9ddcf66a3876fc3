import { useEffect, useState } from 'react';
import { submitBody } from '@shared/schemas/review';
import type { RevisionView } from '@shared/schemas/procedures';
import { TextareaField } from '@/components/ui/field';
import { showServerError, useZodForm } from '@/lib/form';
import { Button } from '@/components/ui/button';
import { useWithdrawProcedure, type useSubmitRevision } from '../api/review-mutations';
import { SignOffDialog, signOffSchemas } from './sign-off-dialog';

type PanelRevision = Pick<RevisionView, 'id' | 'procedureId' | 'number' | 'state' | 'lockVersion'>;

/**
 * The review panel's forms, loaded only for an author's draft or a reviewer's approved revision
 * (revision-review-panel.tsx), so a technician's reader never downloads the form library.
 */
export function SubmitForReview({
  revision,
  submit,
}: {
  revision: PanelRevision;
  /** Kept by the panel, so its outcome stays on screen after the draft has gone to review. */
  submit: ReturnType<typeof useSubmitRevision>;
}) {
  const submitForm = useZodForm(submitBody, {
    defaultValues: { changeReason: '', lockVersion: revision.lockVersion },
  });
  useEffect(() => {
    if (submit.error?.fields.length) showServerError(submitForm, submit.error);
  }, [submit.error, submitForm]);

  return (
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
  );
}

export function WithdrawProcedure({ revision, signerName }: { revision: PanelRevision; signerName: string }) {
  const withdraw = useWithdrawProcedure(revision.procedureId);
  const [withdrawing, setWithdrawing] = useState(false);
  return (
    <>
      <Button variant="danger" onClick={() => setWithdrawing(true)}>
        Withdraw procedure…
      </Button>
      <SignOffDialog
        open={withdrawing}
        title={`Withdraw revision ${revision.number} from use`}
        meaning="withdrawn — technicians can no longer run it"
        signerName={signerName}
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
    </>
  );
}
