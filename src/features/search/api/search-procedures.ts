import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { SearchPage } from '@shared/schemas/search';
import { api } from '@/lib/api-client';

export type { PartialHit, SearchHit, SearchPage } from '@shared/schemas/search';

export interface SearchParams {
  q: string;
  family?: string;
  tag?: string;
  page?: number;
  pageSize?: number;
}

export const searchProcedures = (p: SearchParams) => {
  const qs = new URLSearchParams({ q: p.q });
  if (p.family) qs.set('family', p.family);
  if (p.tag) qs.set('tag', p.tag);
  if (p.page) qs.set('page', String(p.page));
  if (p.pageSize) qs.set('pageSize', String(p.pageSize));
  return api.get<SearchPage>(`/api/search?${qs}`);
};

export const searchQueryOptions = (p: SearchParams) =>
  queryOptions({ queryKey: ['search', p], queryFn: () => searchProcedures(p), staleTime: 10_000 });

/** Results as you type: previous results stay on screen while the next ones load. */
export const useSearch = (p: SearchParams) =>
  useQuery({ ...searchQueryOptions(p), enabled: p.q.trim().length > 0, placeholderData: keepPreviousData });
