import { useId } from 'react';
import type { ProcedureListItem } from '@shared/schemas/procedures';
import { REVISION_STATE_LABELS, type RevisionStateName } from '@shared/schemas/revision-states';

export interface Filters {
  family: string;
  tag: string;
  state: RevisionStateName | '';
}

export const applyFilters = (list: ProcedureListItem[], f: Filters) =>
  list.filter((p) => (!f.family || p.equipmentFamily === f.family) && (!f.tag || p.tags.includes(f.tag)) && (!f.state || p.latest.state === f.state));

function Choice({ label, value, options, onChange }: { label: string; value: string; options: { value: string; label: string }[]; onChange: (v: string) => void }) {
  const id = useId();
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className="text-xs font-semibold">
        {label}
      </label>
      <select id={id} className="min-h-10 rounded border border-rule bg-card px-2 text-sm" value={value} onChange={(e) => onChange(e.target.value)}>
        <option value="">All</option>
        {options.map((o) => (
          <option key={o.value} value={o.value}>
            {o.label}
          </option>
        ))}
      </select>
    </div>
  );
}

/** Filters by equipment family, tag and state, offering only values present in the list. */
export function ProcedureFilters({ procedures, value, onChange }: { procedures: ProcedureListItem[]; value: Filters; onChange: (f: Filters) => void }) {
  const uniq = (xs: string[]) => [...new Set(xs)].sort().map((x) => ({ value: x, label: x }));
  const states = [...new Set(procedures.map((p) => p.latest.state))].map((s) => ({ value: s, label: REVISION_STATE_LABELS[s] }));
  return (
    <div className="flex flex-wrap gap-3" role="search" aria-label="Filter procedures">
      <Choice label="Equipment family" value={value.family} options={uniq(procedures.map((p) => p.equipmentFamily))} onChange={(family) => onChange({ ...value, family })} />
      <Choice label="Tag" value={value.tag} options={uniq(procedures.flatMap((p) => p.tags))} onChange={(tag) => onChange({ ...value, tag })} />
      <Choice label="State" value={value.state} options={states} onChange={(state) => onChange({ ...value, state: state as Filters['state'] })} />
    </div>
  );
}
