import { useId } from 'react';
import type { ProcedureFacets } from '@shared/schemas/procedures';
import { REVISION_STATE_LABELS, type RevisionStateName } from '@shared/schemas/revision-states';

export interface Filters {
  family: string;
  tag: string;
  state: RevisionStateName | '';
}

function Choice({
  label,
  value,
  options,
  onChange,
}: {
  label: string;
  value: string;
  options: { value: string; label: string }[];
  onChange: (v: string) => void;
}) {
  const id = useId();
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className="text-xs font-semibold">
        {label}
      </label>
      <select
        id={id}
        className="min-h-10 rounded border border-rule bg-card px-2 text-sm"
        value={value}
        onChange={(e) => onChange(e.target.value)}
      >
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

/** Filters by equipment family, tag and state, offering the values that occur in the library. */
export function ProcedureFilters({
  facets,
  value,
  onChange,
}: {
  facets: ProcedureFacets | undefined;
  value: Filters;
  onChange: (f: Filters) => void;
}) {
  const plain = (xs: string[] = []) => xs.map((x) => ({ value: x, label: x }));
  // A value chosen before the facets arrive (a shared link) stays selectable.
  const keep = (options: { value: string; label: string }[], v: string, label = v) =>
    v && !options.some((o) => o.value === v) ? [...options, { value: v, label }] : options;
  const states = (facets?.states ?? []).map((s) => ({ value: s, label: REVISION_STATE_LABELS[s] }));
  return (
    <div className="flex flex-wrap gap-3" role="search" aria-label="Filter procedures">
      <Choice
        label="Equipment family"
        value={value.family}
        options={keep(plain(facets?.families), value.family)}
        onChange={(family) => onChange({ ...value, family })}
      />
      <Choice
        label="Tag"
        value={value.tag}
        options={keep(plain(facets?.tags), value.tag)}
        onChange={(tag) => onChange({ ...value, tag })}
      />
      <Choice
        label="State"
        value={value.state}
        options={keep(states, value.state, value.state ? REVISION_STATE_LABELS[value.state] : '')}
        onChange={(state) => onChange({ ...value, state: state as Filters['state'] })}
      />
    </div>
  );
}
