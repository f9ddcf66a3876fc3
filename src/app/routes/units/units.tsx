import { useEffect, useState } from 'react';
import { Problem } from '@/components/errors/problem';
import { paths } from '@/config/paths';
import { useUnits, type UnitFilter } from '@/features/units/api/get-units';
import { UnitForm } from '@/features/units/components/unit-form';
import { UnitsTable } from '@/features/units/components/units-table';
import { hasRole, useSession } from '@/features/auth/api/get-session';
import { Loading } from '@/components/ui/loading';

export default function UnitsPage() {
  const session = useSession();
  const [text, setText] = useState('');
  const [filter, setFilter] = useState<UnitFilter>({});
  useEffect(() => {
    document.title = 'Units · Benchwright';
  }, []);
  useEffect(() => {
    const t = setTimeout(() => setFilter((f) => ({ ...f, q: text.trim() || undefined })), 250);
    return () => clearTimeout(t);
  }, [text]);
  const units = useUnits(filter);
  const canKeep = hasRole(session.data?.user, 'technician', 'author', 'reviewer', 'admin');
  return (
    <section className="flex flex-col gap-6">
      <h1 className="text-2xl font-semibold">Units</h1>
      <div className="flex flex-wrap items-end gap-3">
        <label className="flex flex-col gap-1 text-sm font-semibold">
          Search
          <input
            type="search"
            value={text}
            onChange={(e) => setText(e.target.value)}
            placeholder="Model, serial, owner, job, notes"
            className="min-h-12 w-72 rounded-md border border-rule bg-card px-3 font-normal"
          />
        </label>
        <label className="flex flex-col gap-1 text-sm font-semibold">
          Model
          <select
            value={filter.model ?? ''}
            onChange={(e) => setFilter({ ...filter, model: e.target.value || undefined })}
            className="min-h-12 rounded-md border border-rule bg-card px-3 font-normal"
          >
            <option value="">All models</option>
            {units.data?.models.map((m) => (
              <option key={m}>{m}</option>
            ))}
          </select>
        </label>
        <label className="flex flex-col gap-1 text-sm font-semibold">
          Runs
          <select
            value={filter.state ?? ''}
            onChange={(e) =>
              setFilter({ ...filter, state: (e.target.value || undefined) as UnitFilter['state'] })
            }
            className="min-h-12 rounded-md border border-rule bg-card px-3 font-normal"
          >
            <option value="">Any</option>
            <option value="open-run">With a run in progress</option>
            <option value="out">With an out-of-tolerance run</option>
            <option value="never-run">Never run</option>
          </select>
        </label>
      </div>
      {units.isError && <Problem error={units.error} heading="h2" onRetry={() => void units.refetch()} />}
      {units.isPending ? (
        <Loading />
      ) : (
        units.data && (
          <UnitsTable
            units={units.data.units}
            unitPath={paths.unit.href}
            empty={
              filter.q || filter.model || filter.state
                ? `No unit matches this search.${canKeep ? ' Change the search or filters, or register the unit below.' : ''}`
                : `No units yet.${canKeep ? ' Register one with the form below: model and serial are enough.' : ''}`
            }
          />
        )
      )}
      {canKeep && <UnitForm />}
    </section>
  );
}
