import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { RunView } from '@shared/schemas/runs';
import { api } from '@/lib/api-client';

export function useSignRun(runId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: { password: string }) =>
      api.post<{ run: RunView }>(`/api/runs/${runId}/sign`, { ...body, meaning: 'performed' }),
    onSuccess: (data) => {
      queryClient.setQueryData(['runs', 'one', runId], data);
      return queryClient.invalidateQueries({ queryKey: ['runs', 'list'] });
    },
  });
}
