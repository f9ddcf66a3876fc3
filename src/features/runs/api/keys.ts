import type { RunStatus } from '@shared/schemas/runs';

export interface RunFilter {
  status?: RunStatus;
  mine?: boolean;
}

export const runKeys = {
  all: ['runs'] as const,
  lists: () => [...runKeys.all, 'list'] as const,
  list: (filter: RunFilter) => [...runKeys.lists(), filter] as const,
  detail: (id: string) => [...runKeys.all, 'detail', id] as const,
  technicians: () => [...runKeys.all, 'technicians'] as const,
};
