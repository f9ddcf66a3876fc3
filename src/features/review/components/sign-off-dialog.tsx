import { useEffect, useId, useRef, useState, type FormEvent } from 'react';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';
import type { ApiError } from '@/lib/api-client';

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
  commentRequired: boolean;
  confirmLabel: string;
  pending: boolean;
  error: ApiError | null;
  onConfirm: (v: { password: string; comment: string }) => void;
  onClose: () => void;
}) {
  const ref = useRef<HTMLDialogElement>(null);
  const id = useId();
  const [password, setPassword] = useState('');
  const [comment, setComment] = useState('');
  useEffect(() => {
    const d = ref.current;
    if (!d) return;
    if (props.open && !d.open) d.showModal();
    if (!props.open && d.open) d.close();
    if (!props.open) setPassword('');
  }, [props.open]);
  const submit = (e: FormEvent) => {
    e.preventDefault();
    props.onConfirm({ password, comment });
  };
  return (
    <dialog
      ref={ref}
      aria-labelledby={`${id}-title`}
      onClose={props.onClose}
      className="m-auto w-full max-w-lg rounded-lg border border-rule bg-card p-0 text-graphite backdrop:bg-graphite/40"
    >
      <form onSubmit={submit} className="flex flex-col gap-4 p-5">
        <h2 id={`${id}-title`} className="text-lg font-semibold">
          {props.title}
        </h2>
        <p className="text-sm">
          You are signing as <strong>{props.signerName}</strong>. Meaning of this signature:{' '}
          <strong>{props.meaning}</strong>. Benchwright records your name, role, the time and a hash of the
          exact content you signed.
        </p>
        <div className="flex flex-col gap-1">
          <label htmlFor={`${id}-comment`} className="text-sm font-semibold">
            {props.commentLabel}
            {props.commentRequired ? '' : ' (optional)'}
          </label>
          <textarea
            id={`${id}-comment`}
            className="min-h-24 rounded-md border border-rule bg-paper px-3 py-2"
            value={comment}
            maxLength={4000}
            required={props.commentRequired}
            onChange={(e) => setComment(e.target.value)}
          />
        </div>
        <div className="flex flex-col gap-1">
          <label htmlFor={`${id}-password`} className="text-sm font-semibold">
            Your password
          </label>
          <input
            id={`${id}-password`}
            type="password"
            autoComplete="current-password"
            className="min-h-11 rounded-md border border-rule bg-paper px-3 py-2"
            value={password}
            required
            onChange={(e) => setPassword(e.target.value)}
          />
        </div>
        {props.error && <Notice tone="error">{props.error.message}</Notice>}
        <div className="flex justify-end gap-2">
          <Button variant="quiet" onClick={() => ref.current?.close()}>
            Cancel
          </Button>
          <Button
            type="submit"
            disabled={props.pending || !password || (props.commentRequired && !comment.trim())}
          >
            {props.pending ? 'Signing…' : props.confirmLabel}
          </Button>
        </div>
      </form>
    </dialog>
  );
}
