import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateProcedureBody, RevisionView } from '@shared/schemas/procedures';
import { api } from '@/lib/api-client';
import { revisionQueryOptions } from './get-revision';
import { procedureKeys } from './keys';

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
      queryClient.setQueryData(revisionQueryOptions(data.revision.id).queryKey, { revision: data.revision });
      return queryClient.invalidateQueries({ queryKey: procedureKeys.all });
    },
  });
}
