import { useEffect } from 'react';
import { Link, useSearchParams } from 'react-router-dom';
import { Notice } from '@/components/ui/notice';
import { paths } from '@/config/paths';
import { hasRole, useSession } from '@/features/auth/api/get-session';
import { StartRunForm } from '@/features/runs/components/start-run-form';
import { useUnits } from '@/features/units/api/get-units';

export default function NewRunPage() {
  const session = useSession();
  const [search] = useSearchParams();
  const units = useUnits();
  useEffect(() => {
    document.title = 'Start a bench run · Benchwright';
  }, []);
  if (!hasRole(session.data?.user, 'technician'))
    return <Notice tone="error">Bench runs are started by technicians.</Notice>;
  return (
    <section className="flex flex-col gap-4">
      <h1 className="text-2xl font-semibold">Start a bench run</h1>
      <p className="max-w-2xl text-sm">
        Only approved revisions can be run. The run keeps the revision you start it on, even if a newer one is
        approved while you work. The unit is not in the list?{' '}
        <Link to={paths.units.href()} className="font-semibold text-accent underline">
          Register it first
        </Link>
        .
      </p>
      {units.data && (
        <StartRunForm
          units={units.data.units}
          initialUnitId={search.get('unit') ?? undefined}
          initialRevisionId={search.get('revision') ?? undefined}
          runPath={paths.run.href}
        />
      )}
    </section>
  );
}
