/**
 * Entries not yet acknowledged by the server, kept in localStorage so a closed tab, a reload or a
 * dropped connection loses nothing. Each carries its idempotency key, so resending is harmless, and
 * the person who made it: only their own session ever sends it, never someone else's (another tab
 * may have signed someone else in since — see the CSRF retry in api-client).
 */
import type { EntryAnswer } from '@shared/runs/entry-answer';
import type { EntryBody } from '@shared/schemas/runs';
import { api, ApiError, type Person } from '@/lib/api-client';

export interface PendingEntry {
  runId: string;
  stepId: string;
  /** Who made it (also sent as `body.by`, so the server refuses it from anyone else's session). */
  userId: string;
  userName?: string;
  body: EntryBody;
  queuedAt: string;
  /** Set when the server refused the entry (it will not be retried). */
  refused?: string;
  /** Set when the session changed hands before it was sent: it waits for its maker. */
  waiting?: string;
}

/** What an entry made by someone else says while it waits on this tablet. */
export const waitingMessage = (signedInAs: string, maker: string) =>
  `Signed in as ${signedInAs}; this entry was made by ${maker} — sign in as ${maker} to send it.`;

const STORAGE_KEY = 'benchwright.pending-entries.v1';
const listeners = new Set<() => void>();

function load(): PendingEntry[] {
  try {
    const parsed = JSON.parse(localStorage.getItem(STORAGE_KEY) ?? '[]');
    return Array.isArray(parsed) ? parsed : [];
  } catch {
    return [];
  }
}

let cache: PendingEntry[] = typeof localStorage === 'undefined' ? [] : load();

function save(next: PendingEntry[]) {
  cache = next;
  localStorage.setItem(STORAGE_KEY, JSON.stringify(next));
  listeners.forEach((l) => l());
}

export const subscribePending = (listener: () => void) => {
  listeners.add(listener);
  return () => listeners.delete(listener);
};
export const pendingSnapshot = () => cache;

let currentUser: Person | null = null;
/** The signed-in person on this tablet; entries queued by someone else wait for them. */
export const setQueueUser = (user: Person | null) => {
  currentUser = user;
};
const mine = (p: PendingEntry) => !p.refused && p.userId === currentUser?.id;

let onStored: ((runId: string, answer: EntryAnswer) => void) | null = null;
/** Where acknowledged entries go (the query cache); set once by the bench page. */
export const setStoredHandler = (fn: typeof onStored) => {
  onStored = fn;
};

let checkSession: (() => void) | null = null;
/** Reads the session again (set by the bench page): it changed hands, or a waiting entry's maker may be back. */
export const setSessionCheck = (fn: typeof checkSession) => {
  checkSession = fn;
};

/** The server could not be reached, the session ended or asked us to wait: keep the entry and try later. */
const worthRetrying = (err: unknown) =>
  err instanceof ApiError &&
  (err.status === 0 ||
    err.status >= 500 ||
    [401, 408, 429].includes(err.status) ||
    (err.status === 403 && err.body.code === 'csrf'));

let running = false;
let again = false;

/** Sends queued entries in order; stops at the first one the server cannot take yet. */
export async function flushPending(): Promise<void> {
  if (running) {
    again = true;
    return;
  }
  running = true;
  try {
    do {
      again = false;
      for (const item of cache.filter(mine)) {
        const maker = { id: item.userId, displayName: item.userName ?? 'another person' };
        try {
          const res = await api.put<EntryAnswer>(
            `/api/runs/${item.runId}/entries/${item.stepId}`,
            item.body,
            { madeBy: maker },
          );
          save(cache.filter((p) => p.body.key !== item.body.key));
          onStored?.(item.runId, res);
        } catch (err) {
          if (err instanceof ApiError && err.body.code === 'session-changed') {
            const now = (err.body.signedInAs as Person).displayName;
            save(
              cache.map((p) =>
                p.body.key === item.body.key ? { ...p, waiting: waitingMessage(now, maker.displayName) } : p,
              ),
            );
            checkSession?.();
            return;
          }
          if (worthRetrying(err)) return;
          save(
            cache.map((p) =>
              p.body.key === item.body.key
                ? { ...p, refused: err instanceof Error ? err.message : String(err) }
                : p,
            ),
          );
        }
      }
    } while (again);
  } finally {
    running = false;
  }
}

/** Queue first (so nothing is lost), then try to send straight away. */
export function queueEntry(runId: string, stepId: string, body: Omit<EntryBody, 'key'>) {
  if (!currentUser) throw new Error('queueEntry: nobody is signed in');
  const entry: PendingEntry = {
    runId,
    stepId,
    userId: currentUser.id,
    userName: currentUser.displayName,
    body: { ...body, key: crypto.randomUUID(), by: currentUser.id },
    queuedAt: new Date().toISOString(),
  };
  save([...cache, entry]);
  void flushPending();
  return entry;
}

export const dismissRefused = (key: string) => save(cache.filter((p) => p.body.key !== key));

if (typeof window !== 'undefined') {
  window.addEventListener('online', () => void flushPending());
  window.addEventListener('storage', (e) => {
    if (e.key === STORAGE_KEY) {
      cache = load();
      listeners.forEach((l) => l());
    }
  });
  setInterval(() => {
    if (cache.some(mine)) void flushPending();
    // Someone else's entry waits here: has its maker signed in again (in another tab)?
    else if (currentUser && cache.some((p) => !p.refused && p.userId !== currentUser!.id)) checkSession?.();
  }, 4_000);
}
