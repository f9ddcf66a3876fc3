import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ProcedureListItem } from '@shared/schemas/procedures';
import { api } from '@/lib/api-client';

export const getProcedures = () => api.get<{ procedures: ProcedureListItem[] }>('/api/procedures');

/** The whole visible list; filtering by family, tag and state happens on the client. */
export const proceduresQueryOptions = () => queryOptions({ queryKey: ['procedures'], queryFn: getProcedures });

export const useProcedures = () => useQuery(proceduresQueryOptions());
