import { keepPreviousData, useQuery } from '@tanstack/react-query';
import type { OutboxItemView } from '@shared/schemas/review';
import { api } from '@/lib/api-client';

export interface OutboxPage {
  items: OutboxItemView[];
  total: number;
  pending: number;
  page: number;
  pageSize: number;
}

export function useOutbox(status: '' | 'sent' | 'pending', page: number) {
  const qs = new URLSearchParams({ page: String(page) });
  if (status) qs.set('status', status);
  return useQuery({
    queryKey: ['outbox', status, page],
    queryFn: () => api.get<OutboxPage>(`/api/mail/outbox?${qs}`),
    placeholderData: keepPreviousData,
    refetchInterval: 10_000,
  });
}
