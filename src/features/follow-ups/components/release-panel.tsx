import { RELEASE_MEANING } from '@shared/runs/run-sheet-model';
import { releaseRunBody } from '@shared/schemas/follow-ups';
import type { RunView } from '@shared/schemas/runs';
import { Field } from '@/components/ui/field';
import { FormProblem } from '@/components/ui/form-problem';
import { Notice } from '@/components/ui/notice';
import { hasRole, useSession } from '@/features/auth/api/get-session';
import { showServerError, useZodForm } from '@/lib/form';
import { useReleaseRun } from '../api/follow-ups';

/** Why a follow-up keeps this run from release (the server says the same and decides). */
export function followUpBar(run: RunView): string | null {
  const f = run.followUp;
  if (!f) return null;
  if (!f.closed)
    return 'This run has an open follow-up for its out-of-band readings. It is released only once a reviewer accepts them with a reason; after a repair, the passing re-run is released instead.';
  if (f.closed.run) return 'A later passing run closed this run’s follow-up; that run is the one to release.';
  if (f.disposition?.value === 'return')
    return 'The unit was returned unrepaired after this run; it is not released.';
  return null;
}

/** The second signature on a signed run: a reviewer or a qualified technician other than its performer. */
export function ReleasePanel({ run }: { run: RunView }) {
  const user = useSession().data?.user;
  const release = useReleaseRun(run.id);
  const form = useZodForm(releaseRunBody, { defaultValues: { password: '' } });
  if (run.status !== 'signed' || run.release) return null;
  const bar = followUpBar(run);
  const performer = run.signature?.signer.id === user?.id || run.performedBy.id === user?.id;
  if (performer || !hasRole(user, 'reviewer', 'technician'))
    return (
      <Notice>
        {bar ??
          'Signed as performed; waiting for a reviewer or a qualified technician to check and release it.'}
      </Notice>
    );
  if (bar) return <Notice>{bar}</Notice>;
  const submit = form.handleSubmit((body) =>
    release.mutate(body, {
      onError: (e) => showServerError(form, e),
      onSettled: () => form.resetField('password', { keepError: true }),
    }),
  );
  return (
    <form
      onSubmit={submit}
      aria-label="Check and release"
      className="flex flex-col gap-3 rounded-lg border-2 border-accent bg-card p-4"
      noValidate
    >
      <h2 className="text-lg font-semibold">Check and release</h2>
      <p className="text-sm">
        {run.performedBy.displayName} signed this run as performed. Releasing means:{' '}
        <strong>{RELEASE_MEANING}</strong> The unit’s state becomes released.
      </p>
      <FormProblem formState={form.formState} />
      <div className="max-w-sm">
        <Field
          label="Your password"
          type="password"
          autoComplete="current-password"
          className="min-h-12 bg-paper"
          {...form.register('password')}
          error={form.formState.errors.password?.message}
        />
      </div>
      <button
        type="submit"
        disabled={release.isPending}
        className="min-h-12 self-start rounded-md border border-accent-deep bg-accent px-5 text-base font-semibold text-white disabled:opacity-50"
      >
        {release.isPending ? 'Signing…' : 'Sign as checked and released'}
      </button>
    </form>
  );
}
