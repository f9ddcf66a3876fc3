import { queryOptions, useQuery } from '@tanstack/react-query';
import type { PersonView } from '@shared/schemas/people';
import { api } from '@/lib/api-client';
import { peopleKeys } from './keys';

export const peopleQueryOptions = () =>
  queryOptions({
    queryKey: peopleKeys.list(),
    queryFn: () => api.get<{ people: PersonView[] }>('/api/people'),
  });

export const usePeople = () => useQuery(peopleQueryOptions());
