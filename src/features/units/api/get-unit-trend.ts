import { queryOptions, useQuery } from '@tanstack/react-query';
import type { TrendView } from '@shared/schemas/units';
import { api } from '@/lib/api-client';
import { unitKeys } from './keys';

export const unitTrendQueryOptions = (unitId: string, reading?: string) =>
  queryOptions({
    queryKey: unitKeys.trend(unitId, reading),
    queryFn: () =>
      api.get<TrendView>(
        `/api/units/${unitId}/trend${reading ? `?reading=${encodeURIComponent(reading)}` : ''}`,
      ),
  });

export const useUnitTrend = (unitId: string, reading?: string) =>
  useQuery(unitTrendQueryOptions(unitId, reading));
