import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SignInBody } from '@shared/schemas/auth';
import { api } from '@/lib/api-client';
import type { SessionInfo } from './get-session';

export const signIn = (body: SignInBody) => api.post<SessionInfo>('/api/auth/sign-in', body);

export function useSignIn() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signIn,
    onSuccess: (session) => {
      queryClient.clear();
      queryClient.setQueryData(['session'], session);
    },
  });
}
