import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { RevisionView } from '@shared/schemas/procedures';
import { api } from '@/lib/api-client';
import { getProcedures } from '@/features/procedures/api/get-procedures';

/** The largest page the list API serves. */
const RUNNABLE_LIMIT = 200;

/** Procedures with an approved revision (the only ones a bench run may follow), by title, optionally those whose title contains `q`. */
export const runnableProceduresQueryOptions = (q = '') =>
  queryOptions({
    queryKey: ['procedures', 'runnable', q],
    queryFn: () =>
      getProcedures({
        runnable: 'true',
        q: q || undefined,
        sort: 'title',
        dir: 'asc',
        limit: RUNNABLE_LIMIT,
      }),
  });
export const useRunnableProcedures = (q = '') =>
  useQuery({ ...runnableProceduresQueryOptions(q), placeholderData: keepPreviousData });

export const useRevisionParams = (revisionId: string | undefined) =>
  useQuery({
    queryKey: ['revisions', revisionId, 'params'],
    enabled: !!revisionId,
    queryFn: async () =>
      (await api.get<{ revision: RevisionView }>(`/api/revisions/${revisionId}`)).revision.params,
  });
