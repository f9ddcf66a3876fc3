import { queryOptions, useQuery } from '@tanstack/react-query';
import type { PersonView } from '@shared/schemas/people';
import { api } from '@/lib/api-client';

export const peopleQueryOptions = () =>
  queryOptions({ queryKey: ['people'], queryFn: () => api.get<{ people: PersonView[] }>('/api/people') });

export const usePeople = () => useQuery(peopleQueryOptions());
