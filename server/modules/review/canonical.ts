import { createHash } from 'node:crypto';

/**
 * Canonical JSON: object keys sorted by code point, no whitespace, undefined members dropped (as
 * JSON.stringify does). Two values that mean the same thing always give the same bytes, whatever
 * order PostgreSQL's jsonb or the client happened to put the keys in.
 */
export function canonicalJson(value: unknown): string {
  if (value === null || typeof value !== 'object') {
    if (typeof value === 'number' && !Number.isFinite(value))
      throw new TypeError('canonicalJson: non-finite number');
    if (value === undefined || typeof value === 'function' || typeof value === 'symbol') return 'null';
    return JSON.stringify(value);
  }
  if (value instanceof Date) return JSON.stringify(value.toISOString());
  if (Array.isArray(value)) return `[${value.map((v) => canonicalJson(v)).join(',')}]`;
  const entries = Object.entries(value as Record<string, unknown>)
    .filter(([, v]) => v !== undefined && typeof v !== 'function' && typeof v !== 'symbol')
    .sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
  return `{${entries.map(([k, v]) => `${JSON.stringify(k)}:${canonicalJson(v)}`).join(',')}}`;
}

export const sha256Hex = (text: string) => createHash('sha256').update(text, 'utf8').digest('hex');
