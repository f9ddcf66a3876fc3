import { queryOptions, useQuery } from '@tanstack/react-query';
import type { RevisionView } from '@shared/schemas/procedures';
import { api } from '@/lib/api-client';
import { revisionKeys } from './keys';

export const getRevision = (id: string) =>
  api.get<{ revision: RevisionView }>(`/api/revisions/${encodeURIComponent(id)}`);

export const revisionQueryOptions = (id: string) =>
  queryOptions({ queryKey: revisionKeys.detail(id), queryFn: () => getRevision(id) });

export const useRevision = (id: string) => useQuery(revisionQueryOptions(id));
