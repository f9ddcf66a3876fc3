import type { UnitFilter } from './get-units';

export const unitKeys = {
  all: ['units'] as const,
  list: (filter: UnitFilter) => [...unitKeys.all, 'list', filter] as const,
  detail: (id: string) => [...unitKeys.all, 'detail', id] as const,
  trend: (id: string, reading = '') => [...unitKeys.all, 'trend', id, reading] as const,
};
