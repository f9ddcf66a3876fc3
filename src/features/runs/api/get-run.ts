import { queryOptions, useQuery } from '@tanstack/react-query';
import type { RunView } from '@shared/schemas/runs';
import { api } from '@/lib/api-client';
import { runKeys } from './keys';

export const runQueryOptions = (id: string) =>
  queryOptions({
    queryKey: runKeys.detail(id),
    queryFn: () => api.get<{ run: RunView }>(`/api/runs/${id}`),
  });

/** While a run is open, poll every 3 s so technicians on the same run see each other's entries. */
export const useRun = (id: string) =>
  useQuery({
    ...runQueryOptions(id),
    refetchInterval: (q) => (q.state.data?.run.status === 'in_progress' ? 3_000 : false),
    refetchIntervalInBackground: false,
  });
