import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { RunView, StartRunBody } from '@shared/schemas/runs';
import { api } from '@/lib/api-client';

export function useStartRun() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: StartRunBody) => api.post<{ run: RunView }>('/api/runs', { ...body }),
    onSuccess: (data) => {
      queryClient.setQueryData(['runs', 'one', data.run.id], data);
      return queryClient.invalidateQueries({ queryKey: ['runs', 'list'] });
    },
  });
}
