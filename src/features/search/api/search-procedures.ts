import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { SearchPage } from '@shared/schemas/search';
import { api } from '@/lib/api-client';
import { searchKeys } from './keys';

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

const PAGE_SIZE = 10;

/** The search as the address holds it (read by the page and by its route loader). */
export const searchFromUrl = (params: URLSearchParams): SearchParams => ({
  q: params.get('q') ?? '',
  family: params.get('family') || undefined,
  tag: params.get('tag') || undefined,
  page: Math.max(1, Number(params.get('page') ?? 1) || 1),
  pageSize: PAGE_SIZE,
});

export const searchQueryOptions = (p: SearchParams) =>
  queryOptions({ queryKey: searchKeys.results(p), queryFn: () => searchProcedures(p), staleTime: 10_000 });

/** Results as you type: previous results stay on screen while the next ones load. */
export const useSearch = (p: SearchParams) =>
  useQuery({ ...searchQueryOptions(p), enabled: p.q.trim().length > 0, placeholderData: keepPreviousData });
