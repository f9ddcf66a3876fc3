import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { UnitListItem } from '@shared/schemas/units';
import { api } from '@/lib/api-client';
import { unitKeys } from './keys';

export interface UnitFilter {
  q?: string;
  model?: string;
  state?: 'open-run' | 'out' | 'never-run';
}

const search = (f: UnitFilter) => {
  const p = new URLSearchParams();
  for (const [k, v] of Object.entries(f)) if (v) p.set(k, v);
  const s = p.toString();
  return s ? `?${s}` : '';
};

export const unitsQueryOptions = (filter: UnitFilter = {}) =>
  queryOptions({
    queryKey: unitKeys.list(filter),
    queryFn: () => api.get<{ units: UnitListItem[]; models: string[] }>(`/api/units${search(filter)}`),
    placeholderData: keepPreviousData,
  });

export const useUnits = (filter: UnitFilter = {}) => useQuery(unitsQueryOptions(filter));
