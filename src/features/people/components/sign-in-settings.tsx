import { Notice } from '@/components/ui/notice';
import { useSaveSignInSettings, useSignInSettings } from '../api/account-admin';

/** The shop's rule: reviewers and admins sign in with an authenticator code as well. */
export function SignInSettingsPanel() {
  const settings = useSignInSettings();
  const save = useSaveSignInSettings();
  return (
    <section
      aria-label="Sign-in rules"
      className="flex flex-col gap-3 rounded-lg border border-rule bg-card p-5"
    >
      <h2 className="text-lg font-semibold">Sign-in rules</h2>
      {settings.isError && <Notice tone="error">{settings.error.message}</Notice>}
      {save.error && <Notice tone="error">{save.error.message}</Notice>}
      {settings.data && (
        <label className="flex min-h-11 items-center gap-3">
          <input
            type="checkbox"
            className="size-5"
            checked={settings.data.requireSecondFactor}
            disabled={save.isPending}
            onChange={(e) => save.mutate({ requireSecondFactor: e.target.checked })}
          />
          Reviewers and admins must sign in with an authenticator code as well as their password
        </label>
      )}
      <p className="text-sm text-graphite-soft">
        Those without an authenticator are asked to set one up before they can do anything else. Turn this on
        only after setting up your own on your account page. Each change is recorded in the audit log.
      </p>
    </section>
  );
}
