import { queryOptions, useQuery } from '@tanstack/react-query';
import type { QueueItem, ReviewView, SignatureView } from '@shared/schemas/review';
import { api } from '@/lib/api-client';
import { reviewKeys } from './keys';

export const useReviewQueue = () =>
  useQuery(
    queryOptions({
      queryKey: reviewKeys.queue(),
      queryFn: () => api.get<{ items: QueueItem[] }>('/api/review/queue'),
    }),
  );

export const useRevisionReview = (revisionId: string, enabled = true) =>
  useQuery(
    queryOptions({
      queryKey: reviewKeys.review(revisionId),
      queryFn: () => api.get<{ review: ReviewView }>(`/api/revisions/${revisionId}/review`),
      enabled: enabled && !!revisionId,
    }),
  );

/** Signatures are verified by the server on every read: this always shows the current check. */
export const useSignatures = (revisionId: string) =>
  useQuery(
    queryOptions({
      queryKey: reviewKeys.signatures(revisionId),
      queryFn: () => api.get<{ signatures: SignatureView[] }>(`/api/revisions/${revisionId}/signatures`),
      enabled: !!revisionId,
    }),
  );

export const verifySignature = (signatureId: string) =>
  api.get<{ verified: boolean; storedHash: string; currentHash: string | null; signature: SignatureView }>(
    `/api/signatures/${signatureId}/verify`,
  );
