import type { SearchParams } from './search-procedures';

export const searchKeys = {
  all: ['search'] as const,
  results: (p: SearchParams) => [...searchKeys.all, p] as const,
};
