import { queryOptions, useMutation, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { authKeys } from './keys';

export const invitationQueryOptions = (token: string) =>
  queryOptions({
    queryKey: authKeys.invitation(token),
    queryFn: () =>
      api.get<{ email: string; displayName: string; purpose: 'invitation' | 'reset' }>(
        `/api/auth/invitations/${encodeURIComponent(token)}`,
      ),
    retry: false,
  });
export const useInvitation = (token: string) => useQuery(invitationQueryOptions(token));

export const useSetPassword = () =>
  useMutation({
    mutationFn: (body: { token: string; password: string }) =>
      api.post<{ ok: boolean }>('/api/auth/set-password', body),
  });
