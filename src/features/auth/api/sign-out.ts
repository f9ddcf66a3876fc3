import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

export function useSignOut() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => api.post<{ ok: boolean }>('/api/auth/sign-out'),
    onSettled: async () => {
      queryClient.clear();
      await queryClient.invalidateQueries({ queryKey: ['session'] });
    },
  });
}
