import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { RevisionView } from '@shared/schemas/procedures';
import type { ReviewCommentView, SignatureView } from '@shared/schemas/review';
import { api } from '@/lib/api-client';
import { procedureKeys, revisionKeys } from '@/features/procedures/api/keys';
import { reviewKeys } from './keys';

/** After any transition, everything showing the revision, the queue or procedure lists is stale. */
function useInvalidateAll() {
  const queryClient = useQueryClient();
  return () =>
    Promise.all([
      queryClient.invalidateQueries({ queryKey: reviewKeys.all }),
      queryClient.invalidateQueries({ queryKey: revisionKeys.all }),
      queryClient.invalidateQueries({ queryKey: procedureKeys.all }),
    ]);
}

export function useSubmitRevision(revisionId: string) {
  const invalidate = useInvalidateAll();
  return useMutation({
    mutationFn: (body: { changeReason: string; lockVersion?: number }) =>
      api.post<{ revision: RevisionView }>(`/api/revisions/${revisionId}/submit`, body),
    onSuccess: invalidate,
  });
}

export type Decision = 'approve' | 'return';

export function useDecideRevision(revisionId: string) {
  const invalidate = useInvalidateAll();
  return useMutation({
    mutationFn: ({
      decision,
      password,
      comment,
    }: {
      decision: Decision;
      password: string;
      comment: string;
    }) =>
      api.post<{ revision: RevisionView; signature: SignatureView }>(
        `/api/revisions/${revisionId}/${decision}`,
        { password, comment },
      ),
    onSuccess: invalidate,
  });
}

export function useWithdrawProcedure(procedureId: string) {
  const invalidate = useInvalidateAll();
  return useMutation({
    mutationFn: ({ password, reason }: { password: string; reason: string }) =>
      api.post<{ revision: RevisionView; signature: SignatureView }>(
        `/api/procedures/${procedureId}/withdraw`,
        { password, reason },
      ),
    onSuccess: invalidate,
  });
}

export function useAddComment(revisionId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: { body: string; blockId?: string | null }) =>
      api.post<{ comment: ReviewCommentView }>(`/api/revisions/${revisionId}/comments`, body),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: reviewKeys.review(revisionId) }),
  });
}
