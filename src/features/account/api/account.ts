import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { ChangePasswordBody } from '@shared/schemas/auth';
import type { SessionInfo, SessionUser } from '@/features/auth/api/get-session';
import { api } from '@/lib/api-client';
import { authKeys } from '@/features/auth/api/keys';
import { accountKeys } from './keys';

export interface AccountInfo {
  user: SessionUser;
  secondFactor: { enabled: boolean; required: boolean; setupStarted: boolean; recoveryCodesLeft: number };
}

export const accountQueryOptions = () =>
  queryOptions({ queryKey: accountKeys.all, queryFn: () => api.get<AccountInfo>('/api/auth/account') });
export const useAccount = () => useQuery(accountQueryOptions());

/** After a change to the account, what the session and account page show is read again. */
function useRefreshAccount() {
  const queryClient = useQueryClient();
  return async () => {
    await queryClient.invalidateQueries({ queryKey: accountKeys.all });
    await queryClient.invalidateQueries({ queryKey: authKeys.session });
  };
}

export function useChangePassword() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: ChangePasswordBody) => api.post<SessionInfo>('/api/auth/password', body),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: authKeys.session }),
  });
}

export function useSignOutEverywhere() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => api.post<{ ok: boolean; sessionsEnded: number }>('/api/auth/sign-out-everywhere'),
    onSuccess: async () => {
      queryClient.clear();
      await queryClient.invalidateQueries({ queryKey: authKeys.session });
    },
  });
}

export function useStartTotpSetup() {
  const refresh = useRefreshAccount();
  return useMutation({
    mutationFn: (body: { password: string }) =>
      api.post<{ secret: string; otpauthUrl: string }>('/api/auth/totp/setup', body),
    onSuccess: refresh,
  });
}

export function useConfirmTotp() {
  const refresh = useRefreshAccount();
  return useMutation({
    mutationFn: (body: { code: string }) =>
      api.post<{ recoveryCodes: string[] }>('/api/auth/totp/confirm', body),
    onSuccess: refresh,
  });
}

export function useNewRecoveryCodes() {
  const refresh = useRefreshAccount();
  return useMutation({
    mutationFn: (body: { password: string }) =>
      api.post<{ recoveryCodes: string[] }>('/api/auth/totp/recovery-codes', body),
    onSuccess: refresh,
  });
}

export function useDisableTotp() {
  const refresh = useRefreshAccount();
  return useMutation({
    mutationFn: (body: { password: string }) => api.post<{ ok: boolean }>('/api/auth/totp/disable', body),
    onSuccess: refresh,
  });
}
