import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { RunView } from '@shared/schemas/runs';
import { runQueryOptions } from './get-run';
import { runKeys } from './keys';
import { api } from '@/lib/api-client';

export function useSignRun(runId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: { password: string }) =>
      api.post<{ run: RunView }>(`/api/runs/${runId}/sign`, { ...body, meaning: 'performed' }),
    onSuccess: (data) => {
      queryClient.setQueryData(runQueryOptions(runId).queryKey, data);
      return queryClient.invalidateQueries({ queryKey: runKeys.lists() });
    },
  });
}

/** The named witness co-signs a trainee's finished run as witnessed. */
export function useWitnessRun(runId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: { password: string }) =>
      api.post<{ run: RunView }>(`/api/runs/${runId}/witness`, body),
    onSuccess: (data) => queryClient.setQueryData(runQueryOptions(runId).queryKey, data),
  });
}
