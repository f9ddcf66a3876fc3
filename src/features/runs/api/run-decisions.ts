import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type {
  AwaitingDecision,
  DeviationDecisionBody,
  HoldDecisionBody,
  StepExceptionBody,
} from '@shared/schemas/run-decisions';
import type { RunView } from '@shared/schemas/runs';
import { api } from '@/lib/api-client';
import { runQueryOptions } from './get-run';
import { runKeys } from './keys';

const awaitingKey = [...runKeys.all, 'awaiting-decision'] as const;

/** Holds and deviations waiting for a senior (reviewers and admins). */
export const useAwaitingDecisions = (enabled = true) =>
  useQuery({
    queryKey: awaitingKey,
    enabled,
    queryFn: () => api.get<{ awaiting: AwaitingDecision[] }>('/api/runs/awaiting-decision'),
  });

function useRunWrite<B>(
  runId: string,
  url: (body: B) => string,
  strip: (body: B) => Record<string, unknown> = (b) => b as Record<string, unknown>,
) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: B) => api.post<{ run: RunView }>(url(body), strip(body)),
    onSuccess: (data) => {
      queryClient.setQueryData(runQueryOptions(runId).queryKey, data);
      void queryClient.invalidateQueries({ queryKey: awaitingKey });
      return queryClient.invalidateQueries({ queryKey: runKeys.lists() });
    },
  });
}

export const useDecideHold = (runId: string) =>
  useRunWrite<HoldDecisionBody & { holdId: string }>(
    runId,
    (b) => `/api/runs/${runId}/holds/${b.holdId}/decision`,
    ({ holdId: _h, ...body }) => body,
  );

export const useRecordStepException = (runId: string) =>
  useRunWrite<StepExceptionBody>(runId, () => `/api/runs/${runId}/exceptions`);

export const useDecideDeviation = (runId: string) =>
  useRunWrite<DeviationDecisionBody & { exceptionId: string }>(
    runId,
    (b) => `/api/runs/${runId}/exceptions/${b.exceptionId}/decision`,
    ({ exceptionId: _x, ...body }) => body,
  );
