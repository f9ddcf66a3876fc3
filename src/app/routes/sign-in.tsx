import { useEffect } from 'react';
import { Navigate, useNavigate, useSearchParams } from 'react-router-dom';
import { codeBody, signInBody } from '@shared/schemas/auth';
import { Button } from '@/components/ui/button';
import { Field } from '@/components/ui/field';
import { FormProblem } from '@/components/ui/form-problem';
import { SafetyCaution } from '@/components/ui/safety-caution';
import { useSession } from '@/features/auth/api/get-session';
import { useSignIn, useSignInWithCode } from '@/features/auth/api/sign-in';
import { labelOf, showServerError, useZodForm } from '@/lib/form';

export default function SignIn() {
  const session = useSession();
  const signIn = useSignIn();
  const withCode = useSignInWithCode();
  const codeStep = signIn.data?.secondFactor === 'totp' && !withCode.isSuccess;
  const navigate = useNavigate();
  const [params] = useSearchParams();
  const next = params.get('next')?.startsWith('/') ? params.get('next')! : '/';
  const passwordForm = useZodForm(signInBody, { defaultValues: { email: '', password: '' } });
  const codeForm = useZodForm(codeBody, { defaultValues: { code: '' } });

  useEffect(() => {
    document.title = 'Sign in · Benchwright';
  }, []);

  if (session.data?.user) return <Navigate to={next} replace />;

  const submit = passwordForm.handleSubmit((body) =>
    signIn.mutate(body, {
      onSuccess: (s) => s.user && navigate(next, { replace: true }),
      onError: (e) => showServerError(passwordForm, e),
    }),
  );
  const submitCode = codeForm.handleSubmit((body) =>
    withCode.mutate(body, {
      onSuccess: () => navigate(next, { replace: true }),
      onError: (e) => showServerError(codeForm, e),
    }),
  );

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
          <FormProblem formState={codeForm.formState} />
          <Field
            label={labelOf(codeBody, 'code')}
            autoComplete="one-time-code"
            inputMode="text"
            required
            {...codeForm.register('code')}
            error={codeForm.formState.errors.code?.message}
            autoFocus
          />
          <Button type="submit" disabled={withCode.isPending}>
            {withCode.isPending ? 'Checking…' : 'Continue'}
          </Button>
          <button
            type="button"
            className="self-start text-sm underline"
            onClick={() => {
              signIn.reset();
              withCode.reset();
              codeForm.reset();
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
          <FormProblem formState={passwordForm.formState} />
          <Field
            label={labelOf(signInBody, 'email')}
            type="email"
            autoComplete="username"
            required
            {...passwordForm.register('email')}
            error={passwordForm.formState.errors.email?.message}
            autoFocus
          />
          <Field
            label={labelOf(signInBody, 'password')}
            type="password"
            autoComplete="current-password"
            required
            {...passwordForm.register('password')}
            error={passwordForm.formState.errors.password?.message}
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
