export const openApiKeys = {
  all: ['openapi'] as const,
  document: () => [...openApiKeys.all, 'document'] as const,
};
