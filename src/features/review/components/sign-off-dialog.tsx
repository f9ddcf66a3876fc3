import { useEffect, useId, useRef } from 'react';
import { z } from 'zod';
import { approveBody, returnBody, withdrawBody } from '@shared/schemas/review';
import { Button } from '@/components/ui/button';
import { Field, TextareaField } from '@/components/ui/field';
import { FormProblem } from '@/components/ui/form-problem';
import type { ApiError } from '@/lib/api-client';
import { labelOf, showServerError, useZodForm } from '@/lib/form';

export interface SignOff {
  password: string;
  comment: string;
}

/** The server's rule for each signature, its comment field called `comment` (a withdrawal's is `reason`). */
export const signOffSchemas = {
  approve: approveBody,
  return: returnBody,
  withdraw: z.object({ password: withdrawBody.shape.password, comment: withdrawBody.shape.reason }),
};

/**
 * The signing step: what the signature means, the signer's password entered again, and a comment
 * (or reason). Nothing is recorded until the server has checked the password.
 */
export function SignOffDialog(props: {
  open: boolean;
  title: string;
  meaning: string;
  signerName: string;
  commentLabel: string;
  /** The server's rules for this signature (approveBody, returnBody, …), as password and comment. */
  schema: z.ZodType<SignOff, { password: string; comment?: string }>;
  /** The server's name for the comment when it is not `comment` (a withdrawal's `reason`). */
  commentField?: string;
  confirmLabel: string;
  pending: boolean;
  error: ApiError | null;
  onConfirm: (v: SignOff) => void;
  onClose: () => void;
}) {
  const ref = useRef<HTMLDialogElement>(null);
  const id = useId();
  const form = useZodForm(props.schema, { defaultValues: { password: '', comment: '' } });
  const { errors } = form.formState;
  const { resetField, clearErrors } = form;
  const empty = props.schema.safeParse({ password: 'x', comment: '' });
  const commentRequired = !empty.success && empty.error.issues.some((i) => i.path[0] === 'comment');
  useEffect(() => {
    const d = ref.current;
    if (!d) return;
    if (props.open && !d.open) d.showModal();
    if (!props.open && d.open) d.close();
    if (!props.open) {
      resetField('password');
      clearErrors();
    }
  }, [props.open, resetField, clearErrors]);
  const { error, commentField = 'comment' } = props;
  useEffect(() => {
    if (error) showServerError(form, error, { [commentField]: 'comment' });
  }, [error, commentField, form]);
  return (
    <dialog
      ref={ref}
      aria-labelledby={`${id}-title`}
      onClose={props.onClose}
      className="m-auto w-full max-w-lg rounded-lg border border-rule bg-card p-0 text-graphite backdrop:bg-graphite/40"
    >
      <form onSubmit={form.handleSubmit(props.onConfirm)} className="flex flex-col gap-4 p-5" noValidate>
        <h2 id={`${id}-title`} className="text-lg font-semibold">
          {props.title}
        </h2>
        <p className="text-sm">
          You are signing as <strong>{props.signerName}</strong>. Meaning of this signature:{' '}
          <strong>{props.meaning}</strong>. Benchwright records your name, role, the time and a hash of the
          exact content you signed.
        </p>
        <TextareaField
          label={`${props.commentLabel}${commentRequired ? '' : ' (optional)'}`}
          className="min-h-24 bg-paper"
          maxLength={4000}
          aria-required={commentRequired}
          {...form.register('comment')}
          error={errors.comment?.message}
        />
        <Field
          label={labelOf(props.schema, 'password')}
          type="password"
          autoComplete="current-password"
          className="bg-paper"
          aria-required
          {...form.register('password')}
          error={errors.password?.message}
        />
        <FormProblem formState={form.formState} />
        <div className="flex justify-end gap-2">
          <Button variant="quiet" onClick={() => ref.current?.close()}>
            Cancel
          </Button>
          <Button type="submit" disabled={props.pending}>
            {props.pending ? 'Signing…' : props.confirmLabel}
          </Button>
        </div>
      </form>
    </dialog>
  );
}
