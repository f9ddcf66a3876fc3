import { useState } from 'react';
import { useNavigate } from 'react-router-dom';
import { paths } from '@/config/paths';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';
import { useSignOutEverywhere } from '../api/account';

/** Ends every session of the person (other browsers, the bench tablet, this one). */
export function SignOutEverywhere() {
  const everywhere = useSignOutEverywhere();
  const navigate = useNavigate();
  const [asked, setAsked] = useState(false);
  return (
    <section className="flex flex-col gap-3 rounded-lg border border-rule bg-card p-5">
      <h2 className="text-lg font-semibold">Where you are signed in</h2>
      <p className="text-sm">
        If you left Benchwright open on a shared computer, or think someone else has used your account, sign
        out everywhere. You will sign in again here.
      </p>
      {everywhere.error && <Notice tone="error">{everywhere.error.message}</Notice>}
      {asked ? (
        <div className="flex flex-wrap gap-3">
          <Button
            variant="danger"
            disabled={everywhere.isPending}
            whyDisabled="Signing out…"
            onClick={() => everywhere.mutate(undefined, { onSuccess: () => navigate(paths.signIn.href()) })}
          >
            Yes, sign out everywhere
          </Button>
          <Button variant="quiet" onClick={() => setAsked(false)}>
            Keep me signed in
          </Button>
        </div>
      ) : (
        <Button variant="quiet" className="self-start" onClick={() => setAsked(true)}>
          Sign out everywhere
        </Button>
      )}
    </section>
  );
}
