import { queryOptions, useQuery } from '@tanstack/react-query';
import type { RevisionView } from '@shared/schemas/procedures';
import { api } from '@/lib/api-client';
import { getProcedures } from '@/features/procedures/api/get-procedures';

/** The largest page the list API serves. */
export const RUNNABLE_LIMIT = 200;

/** Procedures with an approved revision (the only ones a bench run may follow), by title. */
export const runnableProceduresQueryOptions = () =>
  queryOptions({
    queryKey: ['procedures', 'runnable'],
    queryFn: () => getProcedures({ runnable: 'true', sort: 'title', dir: 'asc', limit: RUNNABLE_LIMIT }),
  });
export const useRunnableProcedures = () => useQuery(runnableProceduresQueryOptions());

export const useRevisionParams = (revisionId: string | undefined) =>
  useQuery({
    queryKey: ['revisions', revisionId, 'params'],
    enabled: !!revisionId,
    queryFn: async () => (await api.get<{ revision: RevisionView }>(`/api/revisions/${revisionId}`)).revision.params,
  });
