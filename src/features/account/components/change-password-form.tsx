import { useState, type FormEvent } from 'react';
import { PASSWORD_MIN } from '@shared/schemas/limits';
import { Button } from '@/components/ui/button';
import { Field } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { useChangePassword } from '../api/account';

export function ChangePasswordForm() {
  const change = useChangePassword();
  const [currentPassword, setCurrent] = useState('');
  const [newPassword, setNew] = useState('');
  const [repeat, setRepeat] = useState('');
  const mismatch = repeat.length > 0 && repeat !== newPassword;
  const fieldError = (name: string) => change.error?.fields.find((f) => f.field === `body.${name}`)?.reason;

  const submit = (e: FormEvent) => {
    e.preventDefault();
    if (mismatch) return;
    change.mutate(
      { currentPassword, newPassword },
      {
        onSuccess: () => {
          setCurrent('');
          setNew('');
          setRepeat('');
        },
      },
    );
  };

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
      {change.error && <Notice tone="error">{change.error.message}</Notice>}
      <Field
        label="Current password"
        type="password"
        autoComplete="current-password"
        value={currentPassword}
        onChange={(e) => setCurrent(e.target.value)}
        error={fieldError('currentPassword')}
      />
      <Field
        label="New password"
        type="password"
        autoComplete="new-password"
        value={newPassword}
        onChange={(e) => setNew(e.target.value)}
        hint={`At least ${PASSWORD_MIN} characters; a long passphrase is best.`}
        error={fieldError('newPassword')}
      />
      <Field
        label="Repeat the new password"
        type="password"
        autoComplete="new-password"
        value={repeat}
        onChange={(e) => setRepeat(e.target.value)}
        error={mismatch ? 'The two entries differ.' : undefined}
      />
      <Button
        type="submit"
        className="self-start"
        disabled={change.isPending || !currentPassword || newPassword.length < PASSWORD_MIN || mismatch}
      >
        {change.isPending ? 'Changing…' : 'Change password'}
      </Button>
    </form>
  );
}
