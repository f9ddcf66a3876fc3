import { queryOptions, useQuery } from '@tanstack/react-query';
import type { QueueItem, ReviewView, SignatureView } from '@shared/schemas/review';
import { api } from '@/lib/api-client';
import { reviewKeys } from './keys';

export const reviewQueueQueryOptions = () =>
  queryOptions({
    queryKey: reviewKeys.queue(),
    queryFn: () => api.get<{ items: QueueItem[] }>('/api/review/queue'),
  });
export const useReviewQueue = () => useQuery(reviewQueueQueryOptions());

export const revisionReviewQueryOptions = (revisionId: string) =>
  queryOptions({
    queryKey: reviewKeys.review(revisionId),
    queryFn: () => api.get<{ review: ReviewView }>(`/api/revisions/${revisionId}/review`),
  });
export const useRevisionReview = (revisionId: string, enabled = true) =>
  useQuery({ ...revisionReviewQueryOptions(revisionId), enabled: enabled && !!revisionId });

/** Signatures are verified by the server on every read: this always shows the current check. */
export const signaturesQueryOptions = (revisionId: string) =>
  queryOptions({
    queryKey: reviewKeys.signatures(revisionId),
    queryFn: () => api.get<{ signatures: SignatureView[] }>(`/api/revisions/${revisionId}/signatures`),
  });
export const useSignatures = (revisionId: string) =>
  useQuery({ ...signaturesQueryOptions(revisionId), enabled: !!revisionId });

export const verifySignature = (signatureId: string) =>
  api.get<{ verified: boolean; storedHash: string; currentHash: string | null; signature: SignatureView }>(
    `/api/signatures/${signatureId}/verify`,
  );
