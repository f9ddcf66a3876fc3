import type { ProcedureListQuery } from '@shared/schemas/procedures';

/** Procedures (lists, facets, one procedure with its revisions). Invalidating `all` refreshes every list. */
export const procedureKeys = {
  all: ['procedures'] as const,
  lists: () => [...procedureKeys.all, 'list'] as const,
  list: (q: ProcedureListQuery) => [...procedureKeys.lists(), q] as const,
  /** Procedures a bench run may follow, filtered by title. */
  runnable: (q: string) => [...procedureKeys.all, 'runnable', q] as const,
  facets: () => [...procedureKeys.all, 'facets'] as const,
  detail: (id: string) => [...procedureKeys.all, 'detail', id] as const,
};

/** One revision (document, snapshot, state). */
export const revisionKeys = {
  all: ['revisions'] as const,
  detail: (id: string) => [...revisionKeys.all, id] as const,
};
