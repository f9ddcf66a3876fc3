import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SignInBody } from '@shared/schemas/auth';
import { api } from '@/lib/api-client';
import { sessionQueryOptions, type SessionInfo } from './get-session';

export const signIn = (body: SignInBody) => api.post<SessionInfo>('/api/auth/sign-in', body);
export const signInWithCode = (body: { code: string }) =>
  api.post<SessionInfo>('/api/auth/sign-in/code', body);

/** Once someone is signed in, nothing cached for the previous visitor may show. */
function useSignedIn() {
  const queryClient = useQueryClient();
  return (session: SessionInfo) => {
    if (!session.user) return; // half-way: the code step follows
    queryClient.clear();
    queryClient.setQueryData(sessionQueryOptions().queryKey, session);
  };
}

export function useSignIn() {
  return useMutation({ mutationFn: signIn, onSuccess: useSignedIn() });
}

export function useSignInWithCode() {
  return useMutation({ mutationFn: signInWithCode, onSuccess: useSignedIn() });
}
