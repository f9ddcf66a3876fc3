import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { DispositionBody, FollowUpView, UnitStateBody, UnitStateView } from '@shared/schemas/follow-ups';
import type { RunView } from '@shared/schemas/runs';
import { api } from '@/lib/api-client';
import { homeKeys } from '@/features/home/api/keys';
import { runQueryOptions } from '@/features/runs/api/get-run';
import { runKeys } from '@/features/runs/api/keys';
import { unitKeys } from '@/features/units/api/keys';

export const followUpKeys = { all: ['follow-ups'] as const };

export const followUpsQueryOptions = () =>
  queryOptions({
    queryKey: followUpKeys.all,
    queryFn: () => api.get<{ followUps: FollowUpView[] }>('/api/follow-ups'),
  });

export const useFollowUps = () => useQuery(followUpsQueryOptions());

/** After a follow-up or a release changes: the lists, the runs, the units and the home page read again. */
function useRefresh() {
  const queryClient = useQueryClient();
  return () =>
    Promise.all(
      [followUpKeys.all, runKeys.all, unitKeys.all, homeKeys.all].map((queryKey) =>
        queryClient.invalidateQueries({ queryKey }),
      ),
    );
}

export function useDecideFollowUp(id: string) {
  const refresh = useRefresh();
  return useMutation({
    mutationFn: (body: DispositionBody) =>
      api.post<{ followUp: FollowUpView }>(`/api/follow-ups/${encodeURIComponent(id)}/disposition`, body),
    onSuccess: refresh,
  });
}

export function useReassignFollowUp(id: string) {
  const refresh = useRefresh();
  return useMutation({
    mutationFn: (body: { ownerId: string }) =>
      api.post<{ followUp: FollowUpView }>(`/api/follow-ups/${encodeURIComponent(id)}/owner`, body),
    onSuccess: refresh,
  });
}

export function useReleaseRun(runId: string) {
  const queryClient = useQueryClient();
  const refresh = useRefresh();
  return useMutation({
    mutationFn: (body: { password: string }) =>
      api.post<{ run: RunView }>(`/api/runs/${encodeURIComponent(runId)}/release`, body),
    onSuccess: (data) => {
      queryClient.setQueryData(runQueryOptions(runId).queryKey, data);
      return refresh();
    },
  });
}

export function useSetUnitState(unitId: string) {
  const refresh = useRefresh();
  return useMutation({
    mutationFn: (body: UnitStateBody) =>
      api.post<{ states: UnitStateView[] }>(`/api/units/${encodeURIComponent(unitId)}/state`, body),
    onSuccess: refresh,
  });
}
