import { useState, type FormEvent } from 'react';
import { Link, useParams } from 'react-router-dom';
import { PASSWORD_MIN } from '@shared/schemas/limits';
import { Button } from '@/components/ui/button';
import { Field } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { paths } from '@/config/paths';
import { useInvitation, useSetPassword } from '@/features/auth/api/set-password';

export default function SetPassword() {
  const { token = '' } = useParams();
  const invitation = useInvitation(token);
  const setPassword = useSetPassword();
  const [password, setPw] = useState('');
  const [repeat, setRepeat] = useState('');
  const mismatch = repeat.length > 0 && repeat !== password;

  const submit = (e: FormEvent) => {
    e.preventDefault();
    if (mismatch) return;
    setPassword.mutate({ token, password });
  };

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
            {setPassword.error && <Notice tone="error">{setPassword.error.message}</Notice>}
            <Field
              label="New password"
              type="password"
              autoComplete="new-password"
              value={password}
              minLength={PASSWORD_MIN}
              onChange={(e) => setPw(e.target.value)}
              hint={`At least ${PASSWORD_MIN} characters.`}
            />
            <Field
              label="Repeat it"
              type="password"
              autoComplete="new-password"
              value={repeat}
              onChange={(e) => setRepeat(e.target.value)}
              error={mismatch ? 'The two entries differ.' : undefined}
            />
            <Button
              type="submit"
              disabled={setPassword.isPending || password.length < PASSWORD_MIN || mismatch}
            >
              Set password
            </Button>
          </form>
        )
      )}
    </main>
  );
}
