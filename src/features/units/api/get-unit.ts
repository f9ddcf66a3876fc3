import { queryOptions, useQuery } from '@tanstack/react-query';
import type { UnitStateView } from '@shared/schemas/follow-ups';
import type { UnitPhotoView, UnitRunSummary, UnitView } from '@shared/schemas/units';
import { api } from '@/lib/api-client';
import { unitKeys } from './keys';

export interface UnitPage {
  unit: UnitView;
  photos: UnitPhotoView[];
  runs: UnitRunSummary[];
  /** The unit's states, newest first. */
  states?: UnitStateView[];
}

export const unitQueryOptions = (id: string) =>
  queryOptions({ queryKey: unitKeys.detail(id), queryFn: () => api.get<UnitPage>(`/api/units/${id}`) });

export const useUnit = (id: string) => useQuery(unitQueryOptions(id));
