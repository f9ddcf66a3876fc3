import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { UnitBody, UnitView } from '@shared/schemas/units';
import { api } from '@/lib/api-client';
import { unitKeys } from './keys';

/** Creates a unit, or saves one when an id and lockVersion are given. */
export function useSaveUnit() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, lockVersion, ...body }: UnitBody & { id?: string; lockVersion?: number }) =>
      id
        ? api.put<{ unit: UnitView }>(`/api/units/${id}`, { ...body, lockVersion })
        : api.post<{ unit: UnitView }>('/api/units', body),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: unitKeys.all }),
  });
}
