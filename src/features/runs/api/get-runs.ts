import { queryOptions, useQuery } from '@tanstack/react-query';
import type { RunListItem, RunStatus } from '@shared/schemas/runs';
import { api } from '@/lib/api-client';

export const runsQueryOptions = (filter: { status?: RunStatus; mine?: boolean } = {}) =>
  queryOptions({
    queryKey: ['runs', 'list', filter],
    queryFn: () => {
      const p = new URLSearchParams();
      if (filter.status) p.set('status', filter.status);
      if (filter.mine) p.set('mine', '1');
      return api.get<{ runs: RunListItem[] }>(`/api/runs${p.size ? `?${p}` : ''}`);
    },
  });

export const useRuns = (filter: { status?: RunStatus; mine?: boolean } = {}) =>
  useQuery(runsQueryOptions(filter));
