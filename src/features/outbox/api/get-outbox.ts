import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { OutboxItemView } from '@shared/schemas/review';
import { api } from '@/lib/api-client';
import { outboxKeys } from './keys';

export interface OutboxPage {
  items: OutboxItemView[];
  total: number;
  pending: number;
  page: number;
  pageSize: number;
}

export type OutboxStatus = '' | 'sent' | 'pending';

export const outboxQueryOptions = (status: OutboxStatus, page: number) =>
  queryOptions({
    queryKey: outboxKeys.list(status, page),
    queryFn: () => {
      const qs = new URLSearchParams({ page: String(page) });
      if (status) qs.set('status', status);
      return api.get<OutboxPage>(`/api/mail/outbox?${qs}`);
    },
    placeholderData: keepPreviousData,
  });

export const useOutbox = (status: OutboxStatus, page: number) =>
  useQuery({ ...outboxQueryOptions(status, page), refetchInterval: 10_000 });
