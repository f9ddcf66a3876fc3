import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { Eligibility, GrantBody, QualificationView } from '@shared/schemas/registers';
import { api } from '@/lib/api-client';
import { registerKeys } from './keys';

export const qualificationsQueryOptions = (all = false) =>
  queryOptions({
    queryKey: registerKeys.qualifications(all),
    queryFn: () =>
      api.get<{
        qualifications: QualificationView[];
        families: string[];
        technicians: { id: string; displayName: string }[];
      }>(`/api/qualifications${all ? '?all=1' : ''}`),
  });

export const useQualifications = (all = false) => useQuery(qualificationsQueryOptions(all));

export function useGrant() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: GrantBody) => api.post<{ qualification: { id: string } }>('/api/qualifications', body),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: registerKeys.qualificationsAll }),
  });
}

export function useWithdraw() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, reason }: { id: string; reason: string }) =>
      api.post<{ ok: true }>(`/api/qualifications/${encodeURIComponent(id)}/withdraw`, { reason }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: registerKeys.qualificationsAll }),
  });
}

/** May the signed-in technician run this revision alone; if not, why and who could witness. */
export const useEligibility = (revisionId: string) =>
  useQuery({
    queryKey: registerKeys.eligibility(revisionId),
    queryFn: () =>
      api.get<{ eligibility: Eligibility }>(
        `/api/runs/eligibility?revisionId=${encodeURIComponent(revisionId)}`,
      ),
    enabled: revisionId !== '',
  });
