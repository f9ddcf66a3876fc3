import { keepPreviousData, useQuery } from '@tanstack/react-query';
import type { AuditEntryView } from '@shared/schemas/review';
import { api } from '@/lib/api-client';

export interface AuditFilters {
  action?: string;
  personId?: string;
  from?: string;
  to?: string;
  page: number;
}

export interface AuditPage {
  entries: AuditEntryView[];
  total: number;
  page: number;
  pageSize: number;
  actions: string[];
}

export function useAuditLog(filters: AuditFilters) {
  const qs = new URLSearchParams();
  for (const [k, v] of Object.entries(filters)) if (v !== undefined && v !== '') qs.set(k, String(v));
  return useQuery({
    queryKey: ['audit', qs.toString()],
    queryFn: () => api.get<AuditPage>(`/api/audit?${qs}`),
    placeholderData: keepPreviousData,
  });
}

export interface ChainReport {
  checked: number;
  head: { seq: number; rowHash: string } | null;
  firstBroken: { seq: number; id: number; at: string; action: string; reason: string } | null;
}

/** Runs the hash-chain check on demand (it reads the whole log). */
export const useAuditChainCheck = () =>
  useQuery({
    queryKey: ['audit', 'chain'],
    queryFn: async () => (await api.get<{ chain: ChainReport }>('/api/audit/chain')).chain,
    enabled: false,
  });
