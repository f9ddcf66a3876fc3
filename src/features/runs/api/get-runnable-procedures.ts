import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { getProcedures } from '@/features/procedures/api/get-procedures';
import { revisionQueryOptions } from '@/features/procedures/api/get-revision';
import { procedureKeys } from '@/features/procedures/api/keys';

/** The largest page the list API serves. */
const RUNNABLE_LIMIT = 200;

/** Procedures with an approved revision (the only ones a bench run may follow), by title, optionally those whose title contains `q`. */
export const runnableProceduresQueryOptions = (q = '') =>
  queryOptions({
    queryKey: procedureKeys.runnable(q),
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

/** The revision's parameters, read from the same cached revision the reader shows. */
export const useRevisionParams = (revisionId: string | undefined) =>
  useQuery({
    ...revisionQueryOptions(revisionId ?? ''),
    enabled: !!revisionId,
    select: (data) => data.revision.params,
  });
