import { useEffect } from 'react';
import { Problem } from '@/components/errors/problem';
import { RegionBoundary } from '@/components/errors/region-boundary';
import { useAccount } from '@/features/account/api/account';
import { AuthenticatorPanel } from '@/features/account/components/authenticator-panel';
import { ChangePasswordForm } from '@/features/account/components/change-password-form';
import { SignOutEverywhere } from '@/features/account/components/sign-out-everywhere';
import { Loading } from '@/components/ui/loading';

export default function AccountPage() {
  const account = useAccount();
  useEffect(() => {
    document.title = 'Your account · Benchwright';
  }, []);
  return (
    <section className="flex max-w-2xl flex-col gap-6">
      <h1 className="text-2xl font-semibold">Your account</h1>
      {account.isPending && <Loading />}
      {account.isError && (
        <Problem error={account.error} heading="h2" onRetry={() => void account.refetch()} />
      )}
      {account.data && (
        <>
          <p className="text-sm">
            Signed in as <strong>{account.data.user.displayName}</strong> ({account.data.user.email}).
          </p>
          <RegionBoundary label="Authenticator">
            <AuthenticatorPanel account={account.data} />
          </RegionBoundary>
          <ChangePasswordForm />
          <SignOutEverywhere />
        </>
      )}
    </section>
  );
}
