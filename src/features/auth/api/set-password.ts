import { useMutation, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

export const useInvitation = (token: string) =>
  useQuery({
    queryKey: ['invitation', token],
    queryFn: () =>
      api.get<{ email: string; displayName: string; purpose: 'invitation' | 'reset' }>(
        `/api/auth/invitations/${encodeURIComponent(token)}`,
      ),
    retry: false,
  });

export const useSetPassword = () =>
  useMutation({
    mutationFn: (body: { token: string; password: string }) =>
      api.post<{ ok: boolean }>('/api/auth/set-password', body),
  });
