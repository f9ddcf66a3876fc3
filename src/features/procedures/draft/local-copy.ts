import type { DraftFields } from './draft-fields';

/**
 * Unsaved work kept in this browser, keyed by revision id and the lock version it was based on,
 * so a reload or a crash loses nothing and a stale copy still ends in the conflict check.
 */
export interface LocalCopy {
  revisionId: string;
  lockVersion: number;
  keptAt: string;
  draft: DraftFields;
}

const PREFIX = 'benchwright.draft.';
const keyFor = (revisionId: string, lockVersion: number) => `${PREFIX}${revisionId}.${lockVersion}`;

export function keepLocalCopy(revisionId: string, lockVersion: number, draft: DraftFields): boolean {
  const copy: LocalCopy = { revisionId, lockVersion, keptAt: new Date().toISOString(), draft };
  try {
    localStorage.setItem(keyFor(revisionId, lockVersion), JSON.stringify(copy));
    return true;
  } catch {
    return false; // storage full or disabled: the save state says so
  }
}

export function dropLocalCopy(revisionId: string, lockVersion?: number) {
  try {
    if (lockVersion !== undefined) return localStorage.removeItem(keyFor(revisionId, lockVersion));
    for (const key of Object.keys(localStorage))
      if (key.startsWith(`${PREFIX}${revisionId}.`)) localStorage.removeItem(key);
  } catch {
    /* nothing kept, nothing to drop */
  }
}

/** The newest copy kept for this revision, if any. */
export function findLocalCopy(revisionId: string): LocalCopy | null {
  let best: LocalCopy | null = null;
  try {
    for (const key of Object.keys(localStorage)) {
      if (!key.startsWith(`${PREFIX}${revisionId}.`)) continue;
      const copy = JSON.parse(localStorage.getItem(key) ?? 'null') as LocalCopy | null;
      if (copy?.draft?.document && (!best || copy.keptAt > best.keptAt)) best = copy;
    }
  } catch {
    return null;
  }
  return best;
}
