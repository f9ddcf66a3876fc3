import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { ProcedureFacets, ProcedureListQuery, ProcedurePage } from '@shared/schemas/procedures';
import { api } from '@/lib/api-client';
import { procedureKeys } from './keys';

const queryString = (q: ProcedureListQuery) => {
  const qs = new URLSearchParams();
  for (const [k, v] of Object.entries(q)) if (v !== undefined && v !== '') qs.set(k, String(v));
  return qs.size ? `?${qs}` : '';
};

export const getProcedures = (q: ProcedureListQuery = {}) =>
  api.get<ProcedurePage>(`/api/procedures${queryString(q)}`);

/** One page of the list; filtering, sorting and paging happen on the server. */
export const proceduresQueryOptions = (q: ProcedureListQuery) =>
  queryOptions({ queryKey: procedureKeys.list(q), queryFn: () => getProcedures(q) });

/** Keeps the current page on screen while the next one loads. */
export const useProcedures = (q: ProcedureListQuery) =>
  useQuery({ ...proceduresQueryOptions(q), placeholderData: keepPreviousData });

export const procedureFacetsQueryOptions = () =>
  queryOptions({
    queryKey: procedureKeys.facets(),
    queryFn: async () => (await api.get<{ facets: ProcedureFacets }>('/api/procedures/facets')).facets,
    staleTime: 60_000,
  });
export const useProcedureFacets = () => useQuery(procedureFacetsQueryOptions());
