import { useEffect } from 'react';
import { Link, useNavigate, useParams } from 'react-router-dom';
import { RegionBoundary } from '@/components/errors/region-boundary';
import { Notice } from '@/components/ui/notice';
import { paths } from '@/config/paths';
import { hasRole, useSession } from '@/features/auth/api/get-session';
import { useRun } from '@/features/runs/api/get-run';
import { BenchChecklist } from '@/features/runs/components/bench-checklist';
import {
  HoldBanner,
  RunCustody,
  SupersededBanner,
  WaitingEntries,
} from '@/features/runs/components/run-custody';
import { WitnessRunForm } from '@/features/runs/components/witness-run-form';
import { FollowUpCard } from '@/features/follow-ups/components/follow-up-card';
import { ReleasePanel } from '@/features/follow-ups/components/release-panel';
import { DeviationDecisions, HoldPointBanner } from '@/features/runs/components/run-decisions';
import { RunSheet } from '@/features/runs/components/run-sheet';
import { usePendingEntries } from '@/features/runs/lib/use-pending-entries';
import { Loading } from '@/components/ui/loading';
import { PaperSheetPanel } from '@/features/paper-sheets/components/paper-sheet-panel';

/** The bench: checklist mode for the run's performer while it is open; the run sheet otherwise. */
export default function RunPage() {
  const { runId = '' } = useParams();
  const navigate = useNavigate();
  const session = useSession();
  const run = useRun(runId);
  const pending = usePendingEntries(runId);
  useEffect(() => {
    if (run.data)
      document.title = `${run.data.run.unit.model} ${run.data.run.unit.serial}: bench run · Benchwright`;
  }, [run.data]);
  if (run.isPending) return <Loading />;
  // Nothing cached to work from: the route's error boundary says why. (With a cached run, a failed
  // refresh shows the offline banner below and the bench keeps working.)
  if (!run.data) throw run.error;
  const r = run.data.run;
  const user = session.data?.user;
  const open = r.status === 'in_progress';
  const performing = open && !r.hold && hasRole(user, 'technician') && r.performedBy.id === user?.id;
  const inCharge = open && (r.performedBy.id === user?.id || hasRole(user, 'admin'));
  // A reviewer or admin not performing the run decides its holds and deviations.
  const senior =
    open && (hasRole(user, 'reviewer') || hasRole(user, 'admin')) && r.performedBy.id !== user?.id;
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
        <Link
          to={paths.runSheet.href(r.id)}
          className="ml-auto inline-flex min-h-12 items-center rounded-md border border-rule bg-card px-4 font-semibold"
        >
          Run sheet
        </Link>
      </header>
      {run.isError && (
        <Notice tone="error">
          Cannot reach the server right now; entries are kept on this tablet and sent when it is back.
        </Notice>
      )}
      {open && r.hold && <HoldBanner hold={r.hold} />}
      <HoldPointBanner run={r} canDecide={senior} />
      {senior && <DeviationDecisions run={r} />}
      {open && r.superseded && (
        <SupersededBanner
          superseded={r.superseded}
          ownRevision={r.revision.number}
          technician={hasRole(user, 'technician')}
        />
      )}
      <WaitingEntries items={pending.others} steps={r.steps} />
      {performing && <PaperSheetPanel run={r} />}
      {performing ? (
        <BenchChecklist run={r} pending={pending.mine} onSigned={() => navigate(paths.runSheet.href(r.id))} />
      ) : (
        <>
          {open && !r.hold && r.performedBy.id !== user?.id && (
            <Notice>
              {r.performedBy.displayName} is performing this bench run; only they record its entries and sign
              it, unless they hand it over.
            </Notice>
          )}
          {open && !r.hold && r.witness?.person.id === user?.id && !r.witness?.signature?.current && (
            <WitnessRunForm run={r} />
          )}
          {r.followUp && !r.followUp.closed && <FollowUpCard followUp={r.followUp} showRun={false} />}
          <ReleasePanel run={r} />
          <RunSheet run={r} />
        </>
      )}
      {inCharge && (
        <RegionBoundary label="Who has this run">
          <RunCustody run={r} />
        </RegionBoundary>
      )}
    </section>
  );
}
