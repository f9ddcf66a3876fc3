import { queryOptions, useQuery } from '@tanstack/react-query';
import type { TrendView } from '@shared/schemas/units';
import { api } from '@/lib/api-client';

export const unitTrendQueryOptions = (unitId: string, reading?: string) =>
  queryOptions({
    queryKey: ['units', 'trend', unitId, reading ?? ''],
    queryFn: () =>
      api.get<TrendView>(
        `/api/units/${unitId}/trend${reading ? `?reading=${encodeURIComponent(reading)}` : ''}`,
      ),
  });

export const useUnitTrend = (unitId: string, reading?: string) =>
  useQuery(unitTrendQueryOptions(unitId, reading));
