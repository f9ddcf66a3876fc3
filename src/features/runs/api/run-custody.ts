import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { RunView } from '@shared/schemas/runs';
import { runQueryOptions } from './get-run';
import { runKeys } from './keys';
import { api, type Person } from '@/lib/api-client';

/** Technicians a run can be handed over to. */
export const useTechnicians = (enabled: boolean) =>
  useQuery({
    queryKey: runKeys.technicians(),
    enabled,
    queryFn: () => api.get<{ technicians: Person[] }>('/api/runs/technicians'),
  });

function useRunAction<B extends Record<string, unknown>>(runId: string, action: 'handover' | 'abandon') {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: B) => api.post<{ run: RunView }>(`/api/runs/${runId}/${action}`, body),
    onSuccess: (data) => {
      queryClient.setQueryData(runQueryOptions(runId).queryKey, data);
      return queryClient.invalidateQueries({ queryKey: runKeys.lists() });
    },
  });
}

export const useHandOver = (runId: string) => useRunAction<{ to: string; reason: string }>(runId, 'handover');
export const useAbandon = (runId: string) => useRunAction<{ reason: string }>(runId, 'abandon');
