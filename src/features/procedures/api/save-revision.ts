import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { RevisionView, SaveRevisionBody } from '@shared/schemas/procedures';
import { api } from '@/lib/api-client';

/** PUT a draft. 400 carries fields (body.document.content.3.attrs.kind …); 409 carries `current`. */
export const saveRevision = (id: string, body: SaveRevisionBody) =>
  api.put<{ revision: RevisionView }>(
    `/api/revisions/${encodeURIComponent(id)}`,
    body as unknown as Record<string, unknown>,
  );

export function useSaveRevision(id: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: SaveRevisionBody) => saveRevision(id, body),
    onSuccess: (data) => {
      queryClient.setQueryData(['revisions', id], data);
      return queryClient.invalidateQueries({ queryKey: ['procedures'] });
    },
  });
}
