import { useEffect, useState, type FormEvent } from 'react';
import { Navigate, useNavigate, useSearchParams } from 'react-router-dom';
import { Button } from '@/components/ui/button';
import { Field } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { SafetyCaution } from '@/components/ui/safety-caution';
import { useSession } from '@/features/auth/api/get-session';
import { useSignIn, useSignInWithCode } from '@/features/auth/api/sign-in';

export default function SignIn() {
  const session = useSession();
  const signIn = useSignIn();
  const withCode = useSignInWithCode();
  const [code, setCode] = useState('');
  const codeStep = signIn.data?.secondFactor === 'totp' && !withCode.isSuccess;
  const navigate = useNavigate();
  const [params] = useSearchParams();
  const next = params.get('next')?.startsWith('/') ? params.get('next')! : '/';
  const [email, setEmail] = useState('');
  const [password, setPassword] = useState('');

  useEffect(() => {
    document.title = 'Sign in · Benchwright';
  }, []);

  if (session.data?.user) return <Navigate to={next} replace />;

  const submit = (e: FormEvent) => {
    e.preventDefault();
    signIn.mutate({ email, password }, { onSuccess: (s) => s.user && navigate(next, { replace: true }) });
  };
  const submitCode = (e: FormEvent) => {
    e.preventDefault();
    withCode.mutate({ code }, { onSuccess: () => navigate(next, { replace: true }) });
  };
  const fieldError = (name: string) => signIn.error?.fields.find((f) => f.field === `body.${name}`)?.reason;

  return (
    <main className="mx-auto flex min-h-screen max-w-md flex-col justify-center gap-6 px-4 py-10">
      <div>
        <h1 className="text-3xl font-semibold text-accent-deep">Benchwright</h1>
        <p className="mt-1 text-graphite-soft">The shop’s reviewed power-supply procedures.</p>
      </div>
      {codeStep ? (
        <form
          onSubmit={submitCode}
          className="flex flex-col gap-4 rounded-lg border border-rule bg-card p-6 shadow-sm"
          noValidate
        >
          <h2 className="text-xl font-semibold">Authenticator code</h2>
          <p className="text-sm">
            Type the six-digit code your authenticator app shows for Benchwright now, or one of your recovery
            codes.
          </p>
          {withCode.error && !withCode.error.fields.length && (
            <Notice tone="error">{withCode.error.message}</Notice>
          )}
          <Field
            label="Code"
            autoComplete="one-time-code"
            inputMode="text"
            required
            value={code}
            onChange={(e) => setCode(e.target.value)}
            error={withCode.error?.fields.length ? withCode.error.message : undefined}
            autoFocus
          />
          <Button type="submit" disabled={withCode.isPending || code.trim().length < 6}>
            {withCode.isPending ? 'Checking…' : 'Continue'}
          </Button>
          <button
            type="button"
            className="self-start text-sm underline"
            onClick={() => {
              signIn.reset();
              withCode.reset();
              setCode('');
            }}
          >
            Start again with the password
          </button>
        </form>
      ) : (
        <form
          onSubmit={submit}
          className="flex flex-col gap-4 rounded-lg border border-rule bg-card p-6 shadow-sm"
          noValidate
        >
          <h2 className="text-xl font-semibold">Sign in</h2>
          {signIn.error && !signIn.error.fields.length && (
            <Notice tone="error">{signIn.error.message}</Notice>
          )}
          <Field
            label="E-mail"
            type="email"
            autoComplete="username"
            required
            value={email}
            onChange={(e) => setEmail(e.target.value)}
            error={fieldError('email')}
            autoFocus
          />
          <Field
            label="Password"
            type="password"
            autoComplete="current-password"
            required
            value={password}
            onChange={(e) => setPassword(e.target.value)}
            error={fieldError('password')}
          />
          <Button type="submit" disabled={signIn.isPending}>
            {signIn.isPending ? 'Signing in…' : 'Sign in'}
          </Button>
        </form>
      )}
      <SafetyCaution />
    </main>
  );
}
