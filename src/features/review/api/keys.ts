export const reviewKeys = {
  all: ['review'] as const,
  queue: () => [...reviewKeys.all, 'queue'] as const,
  review: (revisionId: string) => [...reviewKeys.all, 'revision', revisionId] as const,
  signatures: (revisionId: string) => [...reviewKeys.all, 'signatures', revisionId] as const,
};
