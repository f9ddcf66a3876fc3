import { queryOptions, useQuery } from '@tanstack/react-query';
import type { RunListItem } from '@shared/schemas/runs';
import { api } from '@/lib/api-client';
import { runKeys, type RunFilter } from './keys';

export const runsQueryOptions = (filter: RunFilter = {}) =>
  queryOptions({
    queryKey: runKeys.list(filter),
    queryFn: () => {
      const p = new URLSearchParams();
      if (filter.status) p.set('status', filter.status);
      if (filter.mine) p.set('mine', '1');
      return api.get<{ runs: RunListItem[] }>(`/api/runs${p.size ? `?${p}` : ''}`);
    },
  });

export const useRuns = (filter: RunFilter = {}) => useQuery(runsQueryOptions(filter));
