import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { PersonView, UpdatePersonBody } from '@shared/schemas/people';
import { api } from '@/lib/api-client';
import { peopleKeys } from './keys';

export function useUpdatePerson() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, ...body }: UpdatePersonBody & { id: string }) =>
      api.patch<{ person: PersonView }>(`/api/people/${id}`, body),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: peopleKeys.all }),
  });
}
