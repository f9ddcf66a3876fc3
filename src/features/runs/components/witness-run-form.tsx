import { WITNESS_MEANING } from '@shared/runs/run-sheet-model';
import { witnessRunBody, type RunView } from '@shared/schemas/runs';
import { Field } from '@/components/ui/field';
import { FormProblem } from '@/components/ui/form-problem';
import { showServerError, useZodForm } from '@/lib/form';
import { useWitnessRun } from '../api/sign-run';

/** Password again, meaning "witnessed": the witness's co-signature on a trainee's run, before the trainee signs. */
export function WitnessRunForm({ run }: { run: RunView }) {
  const witness = useWitnessRun(run.id);
  const form = useZodForm(witnessRunBody, { defaultValues: { password: '' } });
  const submit = form.handleSubmit((body) =>
    witness.mutate(body, {
      onError: (e) => showServerError(form, e),
      onSettled: () => form.resetField('password', { keepError: true }),
    }),
  );
  const again = !!run.witness?.signature && !run.witness.signature.current;
  return (
    <form
      onSubmit={submit}
      aria-label="Co-sign as witness"
      className="flex flex-col gap-3 rounded-lg border-2 border-accent bg-card p-4"
      noValidate
    >
      <h2 className="text-lg font-semibold">Co-sign as witness</h2>
      <p className="text-sm">
        {run.performedBy.displayName} is running this procedure under your eye. Co-signing means:{' '}
        <strong>{WITNESS_MEANING}</strong>
        {again && ' An entry changed after you co-signed, so it needs your signature again.'}
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
        disabled={witness.isPending}
        className="min-h-12 self-start rounded-md border border-accent-deep bg-accent px-5 text-base font-semibold text-white disabled:opacity-50"
      >
        {witness.isPending ? 'Signing…' : 'Sign as witnessed'}
      </button>
    </form>
  );
}
