import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { authKeys } from './keys';

export function useSignOut() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => api.post<{ ok: boolean }>('/api/auth/sign-out'),
    onSettled: async () => {
      queryClient.clear();
      await queryClient.invalidateQueries({ queryKey: authKeys.session });
    },
  });
}
