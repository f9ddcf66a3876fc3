import { z } from 'zod';
import { changePasswordBody } from '@shared/schemas/auth';
import { PASSWORD_MIN } from '@shared/schemas/limits';
import { Button } from '@/components/ui/button';
import { Field } from '@/components/ui/field';
import { FormProblem } from '@/components/ui/form-problem';
import { Notice } from '@/components/ui/notice';
import { labelOf, showServerError, useZodForm } from '@/lib/form';
import { useChangePassword } from '../api/account';

const changePasswordForm = changePasswordBody
  .extend({ repeat: z.string() })
  .refine((v) => v.repeat === v.newPassword, { path: ['repeat'], message: 'The two entries differ.' });

export function ChangePasswordForm() {
  const change = useChangePassword();
  const form = useZodForm(changePasswordForm, {
    defaultValues: { currentPassword: '', newPassword: '', repeat: '' },
  });
  const { errors } = form.formState;
  const submit = form.handleSubmit(({ currentPassword, newPassword }) =>
    change.mutate(
      { currentPassword, newPassword },
      { onSuccess: () => form.reset(), onError: (e) => showServerError(form, e) },
    ),
  );

  return (
    <form
      onSubmit={submit}
      aria-label="Change your password"
      className="flex flex-col gap-4 rounded-lg border border-rule bg-card p-5"
      noValidate
    >
      <h2 className="text-lg font-semibold">Password</h2>
      {change.isSuccess && (
        <Notice tone="success">
          Your password is changed. Every other place you were signed in has been signed out.
        </Notice>
      )}
      <FormProblem formState={form.formState} />
      <Field
        label={labelOf(changePasswordForm, 'currentPassword')}
        type="password"
        autoComplete="current-password"
        {...form.register('currentPassword')}
        error={errors.currentPassword?.message}
      />
      <Field
        label={labelOf(changePasswordForm, 'newPassword')}
        type="password"
        autoComplete="new-password"
        {...form.register('newPassword')}
        hint={`At least ${PASSWORD_MIN} characters; a long passphrase is best.`}
        error={errors.newPassword?.message}
      />
      <Field
        label="Repeat the new password"
        type="password"
        autoComplete="new-password"
        {...form.register('repeat')}
        error={errors.repeat?.message}
      />
      <Button type="submit" className="self-start" disabled={change.isPending}>
        {change.isPending ? 'Changing…' : 'Change password'}
      </Button>
    </form>
  );
}
