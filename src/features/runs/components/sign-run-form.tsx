import { signRunBody } from '@shared/schemas/runs';
import { Field } from '@/components/ui/field';
import { FormProblem } from '@/components/ui/form-problem';
import { Notice } from '@/components/ui/notice';
import { labelOf, showServerError, useZodForm } from '@/lib/form';
import { useSignRun } from '../api/sign-run';

/** Password again, meaning "performed": the technician's signature on the run sheet. */
export function SignRunForm({
  runId,
  ready,
  onSigned,
}: {
  runId: string;
  ready: boolean;
  onSigned: () => void;
}) {
  const sign = useSignRun(runId);
  const form = useZodForm(signRunBody.pick({ password: true }), { defaultValues: { password: '' } });
  const unfinished = (sign.error?.body.unfinished as { position: number; text: string }[] | undefined) ?? [];
  const submit = form.handleSubmit((body) =>
    sign.mutate(body, {
      onSuccess: onSigned,
      onError: (e) => showServerError(form, e),
      onSettled: () => form.resetField('password', { keepError: true }),
    }),
  );
  return (
    <form
      onSubmit={submit}
      className="flex flex-col gap-3 rounded-lg border-2 border-accent bg-card p-4"
      noValidate
    >
      <h2 className="text-lg font-semibold">Sign the run sheet</h2>
      <p className="text-sm">
        Signing means: <strong>I performed this bench run and recorded these readings.</strong> The time comes
        from the server. After signing, nothing on the run sheet can be changed.
      </p>
      {!ready && (
        <Notice>Finish every step, and let pending entries reach the server, before signing.</Notice>
      )}
      <FormProblem formState={form.formState}>
        {unfinished.length > 0 && (
          <ul className="mt-1 list-disc pl-5">
            {unfinished.map((s) => (
              <li key={s.position}>
                Step {s.position}: {s.text}
              </li>
            ))}
          </ul>
        )}
      </FormProblem>
      <div className="max-w-sm">
        <Field
          label={labelOf(signRunBody, 'password')}
          type="password"
          autoComplete="current-password"
          className="min-h-12 bg-paper"
          {...form.register('password')}
          error={form.formState.errors.password?.message}
        />
      </div>
      <button
        type="submit"
        disabled={!ready || sign.isPending}
        className="min-h-12 self-start rounded-md border border-accent-deep bg-accent px-5 text-base font-semibold text-white disabled:opacity-50"
      >
        {sign.isPending ? 'Signing…' : 'Sign as performed'}
      </button>
    </form>
  );
}
