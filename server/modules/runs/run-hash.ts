import type { EntryView } from '../../../shared/schemas/runs';
import { canonicalJson, sha256Hex } from '../review/canonical';

export interface RunContent {
  runId: string;
  revision: { id: string; number: number; hash: string };
  unit: { id: string; model: string; serial: string; owner: string; jobNumber: string };
  params: unknown;
  steps: unknown;
  entries: (Pick<
    EntryView,
    | 'stepId'
    | 'raw'
    | 'measured'
    | 'unit'
    | 'expected'
    | 'low'
    | 'high'
    | 'within'
    | 'done'
    | 'note'
    | 'version'
  > & { instrument?: { id: string; calibrationDue: string }; takenOn?: string })[];
  /** Entries copied from a paper bench sheet: its date and identifier (absent otherwise, so earlier sheets hash as they did). */
  paperSheet?: { date: string; reference: string | null };
  /** A trainee's run: who witnesses it (absent otherwise, so earlier run sheets hash as they did). */
  witnessId?: string;
  /** Hold points reached and steps recorded as not applicable or a deviation (absent when none). */
  holds?: unknown[];
  exceptions?: unknown[];
  /** Each photo's SHA-256 as re-hashed from its stored bytes; null when missing or altered. */
  photos: { id: string; stepId: string | null; sha256: string | null }[];
}

/** SHA-256 of a run sheet's canonical content: what the technician's signature covers. */
export function runContentHash(c: RunContent): string {
  return sha256Hex(
    canonicalJson({
      ...c,
      entries: [...c.entries].sort((a, b) => (a.stepId < b.stepId ? -1 : 1)),
      photos: [...c.photos].sort((a, b) => (a.id < b.id ? -1 : 1)),
    }),
  );
}
