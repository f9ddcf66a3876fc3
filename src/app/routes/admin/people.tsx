import { useEffect } from 'react';
import { Problem } from '@/components/errors/problem';
import { RegionBoundary } from '@/components/errors/region-boundary';
import { Notice } from '@/components/ui/notice';
import { hasRole, useSession } from '@/features/auth/api/get-session';
import { usePeople } from '@/features/people/api/get-people';
import { InviteForm } from '@/features/people/components/invite-form';
import { PeopleTable } from '@/features/people/components/people-table';
import { SignInSettingsPanel } from '@/features/people/components/sign-in-settings';
import { Loading } from '@/components/ui/loading';

export default function PeoplePage() {
  const session = useSession();
  const isAdmin = hasRole(session.data?.user, 'admin');
  const people = usePeople();
  useEffect(() => {
    document.title = 'People · Benchwright';
  }, []);
  if (!isAdmin) return <Notice tone="error">This page is for admins.</Notice>;
  return (
    <section className="flex flex-col gap-6">
      <h1 className="text-2xl font-semibold">People</h1>
      {people.isPending && <Loading />}
      {people.isError && <Problem error={people.error} heading="h2" onRetry={() => void people.refetch()} />}
      {people.data && <PeopleTable people={people.data.people} selfId={session.data!.user!.id} />}
      <InviteForm />
      <RegionBoundary label="Sign-in settings">
        <SignInSettingsPanel />
      </RegionBoundary>
    </section>
  );
}
