import { Link, useParams } from 'react-router-dom';
import { z } from 'zod';
import { setPasswordBody } from '@shared/schemas/auth';
import { PASSWORD_MIN } from '@shared/schemas/limits';
import { Button } from '@/components/ui/button';
import { Field } from '@/components/ui/field';
import { FormProblem } from '@/components/ui/form-problem';
import { Notice } from '@/components/ui/notice';
import { paths } from '@/config/paths';
import { useInvitation, useSetPassword } from '@/features/auth/api/set-password';
import { showServerError, useZodForm } from '@/lib/form';

/** The server's rule for the password, and the same word typed twice. */
const newPasswordForm = setPasswordBody
  .pick({ password: true })
  .extend({ repeat: z.string() })
  .refine((v) => v.repeat === v.password, { path: ['repeat'], message: 'The two entries differ.' });

export default function SetPassword() {
  const { token = '' } = useParams();
  const invitation = useInvitation(token);
  const setPassword = useSetPassword();
  const form = useZodForm(newPasswordForm, { defaultValues: { password: '', repeat: '' } });
  const { errors } = form.formState;
  const submit = form.handleSubmit(({ password }) =>
    setPassword.mutate({ token, password }, { onError: (e) => showServerError(form, e) }),
  );

  return (
    <main className="mx-auto flex min-h-screen max-w-md flex-col justify-center gap-6 px-4 py-10">
      <h1 className="text-3xl font-semibold text-accent-deep">Benchwright</h1>
      {invitation.isPending && <p>Checking your link…</p>}
      {invitation.isError && <Notice tone="error">{invitation.error.message}</Notice>}
      {setPassword.isSuccess ? (
        <Notice tone="success">
          Your password is set.{' '}
          <Link to={paths.signIn.href()} className="underline">
            Sign in
          </Link>
          .
        </Notice>
      ) : (
        invitation.data && (
          <form
            onSubmit={submit}
            className="flex flex-col gap-4 rounded-lg border border-rule bg-card p-6"
            noValidate
          >
            <h2 className="text-xl font-semibold">
              {invitation.data.purpose === 'reset'
                ? `A new password, ${invitation.data.displayName}`
                : `Welcome, ${invitation.data.displayName}`}
            </h2>
            <p className="text-sm">
              Choose a {invitation.data.purpose === 'reset' ? 'new ' : ''}password for {invitation.data.email}
              . A long passphrase is best; there are no other rules.
              {invitation.data.purpose === 'reset' &&
                ' Setting it signs you out everywhere you were signed in.'}
            </p>
            <FormProblem formState={form.formState} />
            <Field
              label="New password"
              type="password"
              autoComplete="new-password"
              minLength={PASSWORD_MIN}
              {...form.register('password')}
              hint={`At least ${PASSWORD_MIN} characters.`}
              error={errors.password?.message}
            />
            <Field
              label="Repeat it"
              type="password"
              autoComplete="new-password"
              {...form.register('repeat')}
              error={errors.repeat?.message}
            />
            <Button type="submit" disabled={setPassword.isPending} whyDisabled="Setting the password…">
              Set password
            </Button>
          </form>
        )
      )}
    </main>
  );
}
