import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type {
  AcknowledgementRecord,
  AcknowledgementStatus,
  AcknowledgementView,
} from '@shared/schemas/acknowledgements';
import type { ReviewDueItem } from '@shared/schemas/review-due';
import { api } from '@/lib/api-client';
import { reviewKeys } from './keys';

/** What changed in an approved revision, and whether the signed-in technician must acknowledge it. */
export const acknowledgementQueryOptions = (revisionId: string) =>
  queryOptions({
    queryKey: reviewKeys.acknowledgement(revisionId),
    queryFn: () =>
      api.get<{ acknowledgement: AcknowledgementView }>(`/api/revisions/${revisionId}/acknowledgement`),
  });
export const useAcknowledgement = (revisionId: string, enabled = true) =>
  useQuery({ ...acknowledgementQueryOptions(revisionId), enabled: enabled && !!revisionId });

export function useAcknowledge(revisionId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (contentHash: string) =>
      api.post<{ acknowledgement: AcknowledgementRecord }>(`/api/revisions/${revisionId}/acknowledge`, {
        contentHash,
      }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: reviewKeys.acknowledgement(revisionId) }),
  });
}

/** For reviewers: who must acknowledge the revision and who has. */
export const acknowledgementStatusQueryOptions = (revisionId: string) =>
  queryOptions({
    queryKey: reviewKeys.acknowledgements(revisionId),
    queryFn: () =>
      api.get<{ status: AcknowledgementStatus }>(`/api/revisions/${revisionId}/acknowledgements`),
  });
export const useAcknowledgementStatus = (revisionId: string, enabled = true) =>
  useQuery({ ...acknowledgementStatusQueryOptions(revisionId), enabled: enabled && !!revisionId });

/** Approved revisions due or overdue for their periodic review. */
export const reviewDueQueryOptions = () =>
  queryOptions({
    queryKey: reviewKeys.due(),
    queryFn: () => api.get<{ items: ReviewDueItem[]; intervalMonths: number }>('/api/review/due'),
  });
export const useReviewDue = () => useQuery(reviewDueQueryOptions());
