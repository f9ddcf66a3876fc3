import { queryOptions, useQuery } from '@tanstack/react-query';
import type { RevisionStateName } from '@shared/schemas/procedures';
import { api } from '@/lib/api-client';
import { procedureKeys } from './keys';

export interface ProcedureDetail {
  procedure: { id: string; title: string; equipmentFamily: string; equipmentModel: string; tags: string[] };
  revisions: {
    id: string;
    number: number;
    state: RevisionStateName;
    author: { id: string; displayName: string };
    updatedAt: string;
    changeReason: string;
  }[];
}

export const getProcedure = (id: string) =>
  api.get<ProcedureDetail>(`/api/procedures/${encodeURIComponent(id)}`);

export const procedureQueryOptions = (id: string) =>
  queryOptions({ queryKey: procedureKeys.detail(id), queryFn: () => getProcedure(id) });

export const useProcedure = (id: string) => useQuery(procedureQueryOptions(id));
