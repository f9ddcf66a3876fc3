import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { PaperSheetInput } from '@shared/schemas/paper-sheets';
import type { RunView } from '@shared/schemas/runs';
import { runQueryOptions } from '@/features/runs/api/get-run';
import { api } from '@/lib/api-client';

/** Say that the next entries of a run are copied from a paper sheet (or, with null, made at the bench). */
export function useSetPaperSheet(runId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (paperSheet: PaperSheetInput | null) =>
      api.put<{ run: RunView }>(`/api/runs/${runId}/paper-sheet`, { paperSheet }),
    onSuccess: (data) => queryClient.setQueryData(runQueryOptions(runId).queryKey, data),
  });
}
