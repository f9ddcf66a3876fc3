import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateProcedureBody, RevisionView } from '@shared/schemas/procedures';
import { api } from '@/lib/api-client';

export interface CreatedProcedure {
  procedure: { id: string };
  revision: RevisionView;
}

export const createProcedure = (body: CreateProcedureBody) =>
  api.post<CreatedProcedure>('/api/procedures', body);

export function useCreateProcedure() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createProcedure,
    onSuccess: (data) => {
      queryClient.setQueryData(['revisions', data.revision.id], { revision: data.revision });
      return queryClient.invalidateQueries({ queryKey: ['procedures'] });
    },
  });
}
