import { useCallback, useEffect, useRef, useState } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import type { RevisionView } from '@shared/schemas/procedures';
import { ApiError, type FieldProblem } from '@/lib/api-client';
import { saveRevision } from '../api/save-revision';
import { revisionQueryOptions } from '../api/get-revision';
import { procedureKeys } from '../api/keys';
import type { DraftFields } from './draft-fields';
import { dropLocalCopy, keepLocalCopy } from './local-copy';

export type SaveState =
  | { kind: 'saved'; at: string }
  | { kind: 'unsaved' }
  | { kind: 'saving' }
  | { kind: 'offline' }
  | { kind: 'refused'; message: string; problems: FieldProblem[] }
  | { kind: 'conflict'; message: string; current: RevisionView; editable: boolean }
  | { kind: 'failed'; message: string };

export const AUTOSAVE_DELAY_MS = 1500;

/**
 * Saving a draft: debounced autosave plus explicit save, a local copy of every unsaved change,
 * and the optimistic lock. A 409 stops autosave until the author chooses a version.
 */
export function useDraftSave(revision: RevisionView, draft: DraftFields) {
  const queryClient = useQueryClient();
  const [state, setState] = useState<SaveState>({ kind: 'saved', at: revision.updatedAt });
  const lockVersion = useRef(revision.lockVersion);
  const latest = useRef(draft);
  latest.current = draft;
  const edits = useRef(0);
  const savedEdits = useRef(0);
  const busy = useRef(false);
  const again = useRef(false);
  const timer = useRef<ReturnType<typeof setTimeout> | undefined>(undefined);
  const blocked = useRef(false);

  const dirty = () => edits.current !== savedEdits.current;

  const save = useCallback(async (): Promise<void> => {
    clearTimeout(timer.current);
    if (blocked.current || !dirty()) return;
    if (busy.current) {
      again.current = true;
      return;
    }
    busy.current = true;
    const count = edits.current;
    const basedOn = lockVersion.current;
    setState({ kind: 'saving' });
    try {
      const { revision: saved } = await saveRevision(revision.id, {
        ...latest.current,
        lockVersion: basedOn,
      });
      queryClient.setQueryData(revisionQueryOptions(revision.id).queryKey, { revision: saved });
      void queryClient.invalidateQueries({ queryKey: procedureKeys.all });
      dropLocalCopy(revision.id, basedOn);
      lockVersion.current = saved.lockVersion;
      savedEdits.current = count;
      if (dirty()) {
        keepLocalCopy(revision.id, saved.lockVersion, latest.current);
        setState({ kind: 'unsaved' });
        again.current = true;
      } else setState({ kind: 'saved', at: saved.updatedAt });
    } catch (e) {
      const err = e instanceof ApiError ? e : new ApiError(-1, e instanceof Error ? e.message : String(e));
      const current = err.body.current as RevisionView | undefined;
      if (err.status === 409 && current) {
        blocked.current = true;
        setState({ kind: 'conflict', message: err.message, current, editable: current.state === 'draft' });
      } else if (err.status === 0) setState({ kind: 'offline' });
      else if (err.status === 400) setState({ kind: 'refused', message: err.message, problems: err.fields });
      else setState({ kind: 'failed', message: err.message });
    } finally {
      busy.current = false;
      if (again.current) {
        again.current = false;
        timer.current = setTimeout(() => void save(), AUTOSAVE_DELAY_MS);
      }
    }
  }, [revision.id, queryClient]);

  /** Call after every edit: keeps a local copy and schedules the autosave. */
  const changed = useCallback(
    (next: DraftFields) => {
      edits.current++;
      latest.current = next;
      keepLocalCopy(revision.id, lockVersion.current, next);
      if (blocked.current) return;
      setState((s) => (s.kind === 'refused' || s.kind === 'offline' ? s : { kind: 'unsaved' }));
      clearTimeout(timer.current);
      timer.current = setTimeout(() => void save(), AUTOSAVE_DELAY_MS);
    },
    [revision.id, save],
  );

  /** Conflict: keep my version, saving it over the server's current one. */
  const keepMine = useCallback(() => {
    if (state.kind !== 'conflict') return;
    lockVersion.current = state.current.lockVersion;
    blocked.current = false;
    void save();
  }, [state, save]);

  /**
   * Adopt a new base lock version: the server's version after a conflict (no `restored`), or a
   * local copy being restored (saved next, so a stale base ends in the conflict check).
   */
  const adopt = useCallback(
    (base: { lockVersion: number; updatedAt: string }, restored?: DraftFields) => {
      dropLocalCopy(revision.id);
      lockVersion.current = base.lockVersion;
      blocked.current = false;
      clearTimeout(timer.current);
      if (restored) {
        edits.current++;
        latest.current = restored;
        keepLocalCopy(revision.id, base.lockVersion, restored);
        setState({ kind: 'unsaved' });
        timer.current = setTimeout(() => void save(), AUTOSAVE_DELAY_MS);
      } else {
        savedEdits.current = edits.current;
        setState({ kind: 'saved', at: base.updatedAt });
      }
    },
    [revision.id, save],
  );

  useEffect(() => {
    const retry = () => void save();
    window.addEventListener('online', retry);
    return () => {
      window.removeEventListener('online', retry);
      clearTimeout(timer.current);
    };
  }, [save]);

  return { state, save, changed, keepMine, adopt, isDirty: dirty };
}
