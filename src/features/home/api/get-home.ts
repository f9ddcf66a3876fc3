import { queryOptions, useQuery } from '@tanstack/react-query';
import type { HomeView } from '@shared/schemas/home';
import { api } from '@/lib/api-client';
import { homeKeys } from './keys';

/** What waits for the signed-in person; asked again on every visit, since work elsewhere changes it. */
export const homeQueryOptions = () =>
  queryOptions({
    queryKey: homeKeys.all,
    queryFn: () => api.get<HomeView>('/api/home'),
    staleTime: 0,
  });

export const useHome = () => useQuery(homeQueryOptions());
