import { createHash } from 'node:crypto';

/** JSON with object keys sorted at every level, so equal content always hashes the same. */
export function canonicalJson(value: unknown): string {
  if (value === null || typeof value !== 'object') return JSON.stringify(value ?? null);
  if (Array.isArray(value)) return `[${value.map(canonicalJson).join(',')}]`;
  const entries = Object.entries(value as Record<string, unknown>)
    .filter(([, v]) => v !== undefined)
    .sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
  return `{${entries.map(([k, v]) => `${JSON.stringify(k)}:${canonicalJson(v)}`).join(',')}}`;
}

export const sha256 = (text: string) => createHash('sha256').update(text, 'utf8').digest('hex');

interface RevisionContent {
  id: string;
  procedureId: string;
  number: number;
  title: string;
  equipmentFamily: string;
  equipmentModel: string;
  document: unknown;
  params: unknown;
}

/** SHA-256 of what a technician follows: the revision's identity, document and design parameters. */
export function revisionContentHash(r: RevisionContent): string {
  return sha256(
    canonicalJson({
      id: r.id,
      procedureId: r.procedureId,
      number: r.number,
      title: r.title,
      equipmentFamily: r.equipmentFamily,
      equipmentModel: r.equipmentModel,
      document: r.document,
      params: r.params,
    }),
  );
}

export interface RunContent {
  runId: string;
  revision: { id: string; number: number; hash: string };
  unit: { id: string; model: string; serial: string; owner: string; jobNumber: string };
  params: unknown;
  steps: unknown;
  entries: {
    stepId: string;
    raw: string | null;
    measured: number | null;
    unit: string | null;
    expected: number | null;
    low: number | null;
    high: number | null;
    within: boolean | null;
    done: boolean;
    note: string;
    version: number;
  }[];
  photos: { id: string; stepId: string | null; sha256: string }[];
}

/** SHA-256 of a run sheet's canonical content: what the technician's signature covers. */
export function runContentHash(c: RunContent): string {
  return sha256(
    canonicalJson({
      ...c,
      entries: [...c.entries].sort((a, b) => (a.stepId < b.stepId ? -1 : 1)),
      photos: [...c.photos].sort((a, b) => (a.id < b.id ? -1 : 1)),
    }),
  );
}
