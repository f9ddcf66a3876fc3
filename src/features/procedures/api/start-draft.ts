import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { RevisionView } from '@shared/schemas/procedures';
import { api } from '@/lib/api-client';
import { revisionQueryOptions } from './get-revision';
import { procedureKeys } from './keys';

/**
 * Starts the next draft from the approved revision, or from `fromRevisionId` (an approved or returned
 * one); 409 names the open revision to continue instead.
 */
export const startDraft = ({
  procedureId,
  fromRevisionId,
}: {
  procedureId: string;
  fromRevisionId?: string;
}) =>
  api.post<{ revision: RevisionView }>(
    `/api/procedures/${encodeURIComponent(procedureId)}/drafts`,
    fromRevisionId ? { fromRevisionId } : {},
  );

export function useStartDraft() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: startDraft,
    onSuccess: (data) => {
      queryClient.setQueryData(revisionQueryOptions(data.revision.id).queryKey, { revision: data.revision });
      return queryClient.invalidateQueries({ queryKey: procedureKeys.all });
    },
  });
}
