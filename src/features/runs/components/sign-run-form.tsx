import { useState, type FormEvent } from 'react';
import { Notice } from '@/components/ui/notice';
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
  const [password, setPassword] = useState('');
  const unfinished = (sign.error?.body.unfinished as { position: number; text: string }[] | undefined) ?? [];
  const submit = (e: FormEvent) => {
    e.preventDefault();
    sign.mutate({ password }, { onSuccess: onSigned, onSettled: () => setPassword('') });
  };
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
      {sign.error && (
        <Notice tone="error">
          {sign.error.message}
          {unfinished.length > 0 && (
            <ul className="mt-1 list-disc pl-5">
              {unfinished.map((s) => (
                <li key={s.position}>
                  Step {s.position}: {s.text}
                </li>
              ))}
            </ul>
          )}
        </Notice>
      )}
      <label className="flex flex-col gap-1 text-sm font-semibold">
        Your password
        <input
          type="password"
          autoComplete="current-password"
          value={password}
          onChange={(e) => setPassword(e.target.value)}
          className="min-h-12 max-w-sm rounded-md border border-rule bg-paper px-3 text-base"
        />
      </label>
      <button
        type="submit"
        disabled={!ready || !password || sign.isPending}
        className="min-h-12 self-start rounded-md border border-accent-deep bg-accent px-5 text-base font-semibold text-white disabled:opacity-50"
      >
        {sign.isPending ? 'Signing…' : 'Sign as performed'}
      </button>
    </form>
  );
}
