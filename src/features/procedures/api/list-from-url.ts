import {
  PROCEDURE_PAGE_SIZES,
  PROCEDURE_SORTS,
  type ProcedureListQuery,
  type ProcedureSort,
} from '@shared/schemas/procedures';
import type { RevisionStateName } from '@shared/schemas/revision-states';

const oneOf = <T extends string>(allowed: readonly T[], v: string | null, fallback: T): T =>
  v && (allowed as readonly string[]).includes(v) ? (v as T) : fallback;

/** The list's state as the address holds it (read by the page and by its route loader). */
export function procedureListFromUrl(params: URLSearchParams) {
  const sort = oneOf<ProcedureSort>(PROCEDURE_SORTS, params.get('sort'), 'updatedAt');
  const dir = oneOf(['asc', 'desc'] as const, params.get('dir'), sort === 'updatedAt' ? 'desc' : 'asc');
  const size = Number(oneOf(PROCEDURE_PAGE_SIZES.map(String), params.get('size'), '50'));
  const page = Math.max(1, Math.floor(Number(params.get('page'))) || 1);
  const filters = {
    family: params.get('family') ?? '',
    tag: params.get('tag') ?? '',
    state: (params.get('state') ?? '') as RevisionStateName | '',
  };
  const q = params.get('q') ?? '';
  const query: ProcedureListQuery = {
    q: q || undefined,
    family: filters.family || undefined,
    tag: filters.tag || undefined,
    state: filters.state || undefined,
    sort,
    dir,
    limit: size,
    offset: (page - 1) * size,
  };
  return { sort, dir, size, page, filters, q, query };
}
