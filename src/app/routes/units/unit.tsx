import { lazy, Suspense, useEffect, useState } from 'react';
import { DataTable } from '@/components/ui/data-table';
import { Link, useParams } from 'react-router-dom';
import { RegionBoundary } from '@/components/errors/region-boundary';
import { paths } from '@/config/paths';
import { hasRole, useSession } from '@/features/auth/api/get-session';
import { useUnit } from '@/features/units/api/get-unit';
import { useUnitTrend } from '@/features/units/api/get-unit-trend';
import { UnitForm } from '@/features/units/components/unit-form';
import { UnitPhotos } from '@/features/units/components/unit-photos';
import { UnitStatePanel } from '@/features/follow-ups/components/unit-state-panel';
import { Loading } from '@/components/ui/loading';

// The plot's code (visx) loads only when a unit has a trend to draw.
/** Whether the revision a visit followed is still the one in use. */
const REVISION_NOW: Partial<Record<string, string>> = {
  approved: 'still current',
  superseded: 'since replaced',
  withdrawn: 'since withdrawn',
};

const TrendPlot = lazy(() => import('@/features/units/components/trend-plot'));

export default function UnitPage() {
  const { unitId = '' } = useParams();
  const session = useSession();
  const page = useUnit(unitId);
  const [reading, setReading] = useState<string | undefined>();
  const trend = useUnitTrend(unitId, reading);
  const [editing, setEditing] = useState(false);
  const user = session.data?.user;
  useEffect(() => {
    if (page.data) document.title = `${page.data.unit.model} ${page.data.unit.serial} · Benchwright`;
  }, [page.data]);
  useEffect(() => {
    if (!reading && trend.data?.readings[0]) setReading(trend.data.readings[0].id);
  }, [reading, trend.data]);
  if (page.isPending) return <Loading />;
  if (page.isError) throw page.error;
  const { unit, photos, runs } = page.data;
  const canKeep = hasRole(user, 'technician', 'author', 'reviewer', 'admin');
  return (
    <section className="flex flex-col gap-6">
      <header className="flex flex-wrap items-end gap-4">
        <div>
          <p className="text-sm text-graphite-soft">
            <Link to={paths.units.href()} className="underline">
              Units
            </Link>
          </p>
          <h1 className="text-2xl font-semibold">
            {unit.model} · <span className="value">{unit.serial}</span>
          </h1>
          <p className="text-sm">
            {unit.owner || 'No owner recorded'}
            {unit.jobNumber && (
              <>
                {' '}
                · job <span className="value">{unit.jobNumber}</span>
              </>
            )}
          </p>
        </div>
        <div className="ml-auto flex gap-2">
          {hasRole(user, 'technician') && (
            <Link
              to={paths.newRun.href(unit.id)}
              className="inline-flex min-h-12 items-center rounded-md border border-accent-deep bg-accent px-4 font-semibold text-white"
            >
              Start a bench run on this unit
            </Link>
          )}
          {canKeep && (
            <button
              type="button"
              onClick={() => setEditing(!editing)}
              className="min-h-12 rounded-md border border-rule bg-card px-4 font-semibold"
            >
              {editing ? 'Close editing' : 'Edit unit'}
            </button>
          )}
        </div>
      </header>
      {unit.notes && (
        <p className="whitespace-pre-line rounded-md border border-rule bg-card p-3 text-sm">{unit.notes}</p>
      )}
      {editing && <UnitForm key={unit.lockVersion} unit={unit} onSaved={() => setEditing(false)} />}

      <RegionBoundary label="Unit state">
        <UnitStatePanel unitId={unit.id} states={page.data.states ?? []} />
      </RegionBoundary>

      <section>
        <h2 className="mb-2 text-lg font-semibold">Photos</h2>
        <RegionBoundary label="Photos">
          <UnitPhotos unitId={unit.id} photos={photos} canAdd={canKeep} />
        </RegionBoundary>
      </section>

      <section>
        <h2 className="mb-2 text-lg font-semibold">Bench runs on this unit</h2>
        {runs.length ? (
          <DataTable columns={['Started', 'Procedure', 'Mains', 'Technician', 'Status']}>
            {runs.map((r) => (
              <tr key={r.id} className="border-b border-rule last:border-0">
                <td className="px-3 py-2">{new Date(r.startedAt).toLocaleString()}</td>
                <td className="px-3 py-2">
                  <Link
                    to={r.status === 'signed' ? paths.runSheet.href(r.id) : paths.run.href(r.id)}
                    className="font-semibold text-accent-deep underline"
                  >
                    {r.title}
                  </Link>{' '}
                  <span className="text-graphite-soft" data-run-revision={r.revisionState}>
                    rev. {r.revisionNumber}
                    {REVISION_NOW[r.revisionState] && `, ${REVISION_NOW[r.revisionState]}`}
                  </span>
                </td>
                <td className="value px-3 py-2">
                  {r.params.mainsVoltage} V / {r.params.mainsFrequency} Hz
                </td>
                <td className="px-3 py-2">{r.startedBy.displayName}</td>
                <td className="px-3 py-2">
                  {
                    { signed: 'Signed', abandoned: 'Closed as abandoned', in_progress: 'In progress' }[
                      r.status
                    ]
                  }
                  {r.outOfTolerance && (
                    <span className="ml-2 font-semibold text-out">▲ out of tolerance</span>
                  )}
                </td>
              </tr>
            ))}
          </DataTable>
        ) : (
          <p className="text-sm text-graphite-soft">
            No bench runs on this unit yet.
            {hasRole(user, 'technician') && ' Start one with “Start a bench run on this unit” above.'}
          </p>
        )}
      </section>

      <section>
        <h2 className="mb-2 text-lg font-semibold">Trend of one reading across visits</h2>
        {trend.data && trend.data.readings.length > 0 ? (
          <div className="flex flex-col gap-3">
            <label className="flex flex-col gap-1 text-sm font-semibold">
              Reading
              <select
                value={reading ?? ''}
                onChange={(e) => setReading(e.target.value)}
                className="min-h-12 max-w-md rounded-md border border-rule bg-card px-3 font-normal"
              >
                {trend.data.readings.map((r) => (
                  <option key={r.id} value={r.id}>
                    {r.label} ({r.count} visit{r.count === 1 ? '' : 's'})
                  </option>
                ))}
              </select>
            </label>
            {trend.data.reading && (
              <RegionBoundary label="Trend plot">
                <Suspense fallback={<Loading what="the plot" lines={3} />}>
                  <TrendPlot view={{ ...trend.data, reading: trend.data.reading }} />
                </Suspense>
              </RegionBoundary>
            )}
          </div>
        ) : (
          <p className="text-sm text-graphite-soft">
            Readings appear here once they are recorded in bench runs.
          </p>
        )}
      </section>
    </section>
  );
}
