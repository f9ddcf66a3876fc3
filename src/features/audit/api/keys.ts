import type { AuditFilters } from './get-audit';

export const auditKeys = {
  all: ['audit'] as const,
  log: (filters: AuditFilters) => [...auditKeys.all, 'log', filters] as const,
  chain: () => [...auditKeys.all, 'chain'] as const,
};
