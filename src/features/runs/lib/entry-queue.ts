/**
 * Entries not yet acknowledged by the server, kept in localStorage so a closed tab, a reload or a
 * dropped connection loses nothing. Each carries its idempotency key, so resending is harmless.
 */
import type { EntryBody, RunView } from '@shared/schemas/runs';
import { api, ApiError } from '@/lib/api-client';

export interface PendingEntry {
  runId: string;
  stepId: string;
  /** Who made it: only their own session ever sends it (no entry is attributed to someone else). */
  userId: string;
  body: EntryBody;
  queuedAt: string;
  /** Set when the server refused the entry (it will not be retried). */
  refused?: string;
}

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

let currentUser: string | null = null;
/** The signed-in person on this tablet; entries queued by someone else wait for them. */
export const setQueueUser = (id: string | null) => {
  currentUser = id;
};

let onStored: ((runId: string, run: RunView) => void) | null = null;
/** Where acknowledged entries go (the query cache); set once by the bench page. */
export const setStoredHandler = (fn: typeof onStored) => {
  onStored = fn;
};

/** The server could not be reached or asked us to wait: keep the entry and try later. */
const worthRetrying = (err: unknown) => err instanceof ApiError && (err.status === 0 || err.status >= 500 || [401, 403, 408, 429].includes(err.status));

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
      for (const item of cache.filter((p) => !p.refused && p.userId === currentUser)) {
        try {
          const res = await api.put<{ run: RunView }>(`/api/runs/${item.runId}/entries/${item.stepId}`, item.body);
          save(cache.filter((p) => p.body.key !== item.body.key));
          onStored?.(item.runId, res.run);
        } catch (err) {
          if (worthRetrying(err)) return;
          save(cache.map((p) => (p.body.key === item.body.key ? { ...p, refused: err instanceof Error ? err.message : String(err) } : p)));
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
  const entry: PendingEntry = { runId, stepId, userId: currentUser, body: { ...body, key: crypto.randomUUID() }, queuedAt: new Date().toISOString() };
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
    if (cache.some((p) => !p.refused && p.userId === currentUser)) void flushPending();
  }, 4_000);
}
