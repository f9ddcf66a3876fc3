import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { AuditEntryView } from '@shared/schemas/review';
import { api } from '@/lib/api-client';
import { auditKeys } from './keys';

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

export const auditLogQueryOptions = (filters: AuditFilters) =>
  queryOptions({
    queryKey: auditKeys.log(filters),
    queryFn: () => {
      const qs = new URLSearchParams();
      for (const [k, v] of Object.entries(filters)) if (v !== undefined && v !== '') qs.set(k, String(v));
      return api.get<AuditPage>(`/api/audit?${qs}`);
    },
    placeholderData: keepPreviousData,
  });

export const useAuditLog = (filters: AuditFilters) => useQuery(auditLogQueryOptions(filters));

export interface ChainReport {
  checked: number;
  head: { seq: number; rowHash: string } | null;
  firstBroken: { seq: number; id: number; at: string; action: string; reason: string } | null;
}

/** Runs the hash-chain check on demand (it reads the whole log). */
export const useAuditChainCheck = () =>
  useQuery({
    queryKey: auditKeys.chain(),
    queryFn: async () => (await api.get<{ chain: ChainReport }>('/api/audit/chain')).chain,
    enabled: false,
  });
