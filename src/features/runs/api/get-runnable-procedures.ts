import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ProcedureListItem, RevisionView } from '@shared/schemas/procedures';
import { api } from '@/lib/api-client';

/** Procedures with an approved revision: the only ones a bench run may follow. */
export const runnableProceduresQueryOptions = () =>
  queryOptions({
    queryKey: ['procedures', 'runnable'],
    queryFn: async () => (await api.get<{ procedures: ProcedureListItem[] }>('/api/procedures')).procedures.filter((p) => p.approved),
  });
export const useRunnableProcedures = () => useQuery(runnableProceduresQueryOptions());

export const useRevisionParams = (revisionId: string | undefined) =>
  useQuery({
    queryKey: ['revisions', revisionId, 'params'],
    enabled: !!revisionId,
    queryFn: async () => (await api.get<{ revision: RevisionView }>(`/api/revisions/${revisionId}`)).revision.params,
  });
