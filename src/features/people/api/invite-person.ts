import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { PersonView } from '@shared/schemas/people';
import type { Role } from '@shared/schemas/roles';
import { api } from '@/lib/api-client';
import { peopleKeys } from './keys';

export interface InviteResult {
  person: PersonView;
  mailedTo: string;
  expiresInDays: number;
}

export function useInvitePerson() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: { email: string; displayName: string; roles: Role[] }) =>
      api.post<InviteResult>('/api/people/invitations', body),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: peopleKeys.all }),
  });
}
