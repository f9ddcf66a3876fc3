import { useEffect } from 'react';
import { Link, useNavigate, useParams } from 'react-router-dom';
import { Notice } from '@/components/ui/notice';
import { paths } from '@/config/paths';
import { hasRole, useSession } from '@/features/auth/api/get-session';
import { useRun } from '@/features/runs/api/get-run';
import { BenchChecklist } from '@/features/runs/components/bench-checklist';
import { RunSheet } from '@/features/runs/components/run-sheet';
import { usePendingEntries } from '@/features/runs/lib/use-pending-entries';

/** The bench: checklist mode while the run is open; the run sheet once it is signed. */
export default function RunPage() {
  const { runId = '' } = useParams();
  const navigate = useNavigate();
  const session = useSession();
  const run = useRun(runId);
  const pending = usePendingEntries(runId);
  useEffect(() => {
    if (run.data) document.title = `${run.data.run.unit.model} ${run.data.run.unit.serial}: bench run · Benchwright`;
  }, [run.data]);
  if (run.isPending) return <p>Loading…</p>;
  if (!run.data) return <Notice tone="error">{run.error?.message ?? 'Cannot load this run.'}</Notice>;
  const r = run.data.run;
  const tech = hasRole(session.data?.user, 'technician');
  return (
    <section className="flex flex-col gap-4">
      <header className="flex flex-wrap items-end gap-3">
        <div>
          <p className="text-sm text-graphite-soft">
            <Link to={paths.unit.href(r.unit.id)} className="underline">
              {r.unit.model} · {r.unit.serial}
            </Link>{' '}
            · revision {r.revision.number}
          </p>
          <h1 className="text-2xl font-semibold">{r.title}</h1>
        </div>
        <Link to={paths.runSheet.href(r.id)} className="ml-auto inline-flex min-h-12 items-center rounded-md border border-rule bg-card px-4 font-semibold">
          Run sheet
        </Link>
      </header>
      {run.isError && <Notice tone="error">Cannot reach the server right now; entries are kept on this tablet and sent when it is back.</Notice>}
      {r.status === 'signed' ? (
        <RunSheet run={r} />
      ) : tech ? (
        <BenchChecklist run={r} pending={pending} onSigned={() => navigate(paths.runSheet.href(r.id))} />
      ) : (
        <>
          <Notice>This bench run is in progress; entries are made by technicians.</Notice>
          <RunSheet run={r} />
        </>
      )}
    </section>
  );
}
