import { useQueryClient } from '@tanstack/react-query';
import { useEffect, useMemo, useSyncExternalStore } from 'react';
import { applyEntryAnswer } from '@shared/runs/entry-answer';
import { useSession } from '@/features/auth/api/get-session';
import { authKeys } from '@/features/auth/api/keys';
import { runQueryOptions } from '../api/get-run';
import {
  flushPending,
  pendingSnapshot,
  setQueueUser,
  setSessionCheck,
  setStoredHandler,
  subscribePending,
  waitingMessage,
  type PendingEntry,
} from './entry-queue';

/**
 * This run's unacknowledged entries: `mine` (sent from this session) and `others` (made by someone
 * else, waiting here until they sign in again, each with the message saying so), and the wiring that
 * puts acknowledged ones in the query cache.
 */
export function usePendingEntries(runId: string) {
  const queryClient = useQueryClient();
  const all = useSyncExternalStore(subscribePending, pendingSnapshot, pendingSnapshot);
  const user = useSession().data?.user ?? null;
  setQueueUser(user && { id: user.id, displayName: user.displayName });
  useEffect(() => {
    // The answer holds what the entry changed: applied to the run held, else the run is read again.
    setStoredHandler((id, answer) => {
      const { queryKey } = runQueryOptions(id);
      const held = queryClient.getQueryData(queryKey)?.run;
      const run = held && applyEntryAnswer(held, answer);
      if (run) queryClient.setQueryData(queryKey, { run });
      else void queryClient.invalidateQueries({ queryKey });
    });
    setSessionCheck(() => void queryClient.invalidateQueries({ queryKey: authKeys.session }));
    void flushPending();
    return () => setSessionCheck(null);
  }, [queryClient, user?.id]);
  return useMemo(() => {
    const here = all.filter((p) => p.runId === runId);
    const others: (PendingEntry & { waiting: string })[] = here
      .filter((p) => p.userId !== user?.id && !p.refused)
      .map((p) => ({
        ...p,
        waiting: waitingMessage(user?.displayName ?? 'nobody', p.userName ?? 'another person'),
      }));
    return { mine: here.filter((p) => p.userId === user?.id), others };
  }, [all, runId, user?.id, user?.displayName]);
}
