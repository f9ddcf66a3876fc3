import { useQueryClient } from '@tanstack/react-query';
import { useEffect, useMemo, useSyncExternalStore } from 'react';
import { useSession } from '@/features/auth/api/get-session';
import { flushPending, pendingSnapshot, setQueueUser, setStoredHandler, subscribePending } from './entry-queue';

/** This run's unacknowledged entries, and the wiring that puts acknowledged ones in the query cache. */
export function usePendingEntries(runId: string) {
  const queryClient = useQueryClient();
  const all = useSyncExternalStore(subscribePending, pendingSnapshot, pendingSnapshot);
  const userId = useSession().data?.user?.id ?? null;
  setQueueUser(userId);
  useEffect(() => {
    setStoredHandler((id, run) => queryClient.setQueryData(['runs', 'one', id], { run }));
    void flushPending();
  }, [queryClient, userId]);
  return useMemo(() => all.filter((p) => p.runId === runId && p.userId === userId), [all, runId, userId]);
}
