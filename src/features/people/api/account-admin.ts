import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { PersonView } from '@shared/schemas/people';
import { api } from '@/lib/api-client';
import { authKeys } from '@/features/auth/api/keys';
import { peopleKeys } from './keys';

/** Mails the person a one-time link to choose a new password; the admin never sees the link. */
export function usePasswordReset() {
  return useMutation({
    mutationFn: (id: string) =>
      api.post<{ mailedTo: string; expiresInHours: number }>(`/api/people/${id}/password-reset`),
  });
}

export function useSecondFactorReset() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (id: string) => api.post<{ person: PersonView }>(`/api/people/${id}/second-factor-reset`),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: peopleKeys.all }),
  });
}

export interface SignInSettings {
  requireSecondFactor: boolean;
  updatedAt: string | null;
}

export const signInSettingsQueryOptions = () =>
  queryOptions({
    queryKey: peopleKeys.signInSettings(),
    queryFn: () => api.get<SignInSettings>('/api/settings/sign-in'),
  });
export const useSignInSettings = () => useQuery(signInSettingsQueryOptions());

export function useSaveSignInSettings() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: { requireSecondFactor: boolean }) =>
      api.put<SignInSettings>('/api/settings/sign-in', body),
    onSuccess: async () => {
      await queryClient.invalidateQueries({ queryKey: peopleKeys.signInSettings() });
      await queryClient.invalidateQueries({ queryKey: authKeys.session });
    },
  });
}
