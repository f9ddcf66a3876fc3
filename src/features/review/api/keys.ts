export const reviewKeys = {
  all: ['review'] as const,
  queue: () => [...reviewKeys.all, 'queue'] as const,
  review: (revisionId: string) => [...reviewKeys.all, 'revision', revisionId] as const,
  signatures: (revisionId: string) => [...reviewKeys.all, 'signatures', revisionId] as const,
  acknowledgement: (revisionId: string) => [...reviewKeys.all, 'acknowledgement', revisionId] as const,
  acknowledgements: (revisionId: string) => [...reviewKeys.all, 'acknowledgements', revisionId] as const,
  due: () => [...reviewKeys.all, 'due'] as const,
};
