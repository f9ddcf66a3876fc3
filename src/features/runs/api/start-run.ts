import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { RunView, StartRunBody } from '@shared/schemas/runs';
import { api } from '@/lib/api-client';
import { runQueryOptions } from './get-run';
import { runKeys } from './keys';

export function useStartRun() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: StartRunBody) => api.post<{ run: RunView }>('/api/runs', { ...body }),
    onSuccess: (data) => {
      queryClient.setQueryData(runQueryOptions(data.run.id).queryKey, data);
      return queryClient.invalidateQueries({ queryKey: runKeys.lists() });
    },
  });
}
