import { createHash } from 'node:crypto';
import { sql } from 'drizzle-orm';
import type { Db } from '../db/client';

export const GENESIS_HASH = '0'.repeat(64);
const SEPARATOR = '\u001f';
const NULL_MARK = '\\N';
const BATCH = 5_000;

export interface ChainRow {
  seq: number;
  id: number;
  at: string;
  actorId: string | null;
  action: string;
  subject: string | null;
  details: string;
  ip: string | null;
  prevHash: string;
  rowHash: string;
}

export interface ChainReport {
  checked: number;
  /**
   * The last entry and its hash when every link holds. Written down elsewhere now and then, it is
   * the anchor that shows a later deletion from the end, or a chain recomputed by someone with
   * owner rights, which the chain alone cannot.
   */
  head: { seq: number; rowHash: string } | null;
  /** The first row that breaks the chain, or null when every link holds. */
  firstBroken: { seq: number; id: number; at: string; action: string; reason: string } | null;
}

/** SHA-256 (hex) of one row as the database chained it (drizzle/0012: benchwright_audit_text). */
export function auditRowHash(r: Omit<ChainRow, 'rowHash'>): string {
  const text = [
    r.seq,
    r.id,
    r.at,
    r.actorId ?? NULL_MARK,
    r.action,
    r.subject ?? NULL_MARK,
    r.details,
    r.ip ?? NULL_MARK,
    r.prevHash,
  ].join(SEPARATOR);
  return createHash('sha256').update(text, 'utf8').digest('hex');
}

/** Why a row breaks the chain after `before` (undefined for the first row), or null when it holds. */
export function brokenLink(row: ChainRow, before: ChainRow | undefined): string | null {
  if (row.seq !== (before?.seq ?? 0) + 1) return `entry ${(before?.seq ?? 0) + 1} is missing`;
  if (row.prevHash !== (before?.rowHash ?? GENESIS_HASH)) return 'does not link to the entry before it';
  if (row.rowHash !== auditRowHash(row)) return 'its content no longer matches its hash';
  return null;
}

/**
 * Walks the whole audit log in chain order, recomputing every hash here rather than in the
 * database that wrote it, and reports the first broken link.
 */
export async function verifyAuditChain(db: Db): Promise<ChainReport> {
  let before: ChainRow | undefined;
  let checked = 0;
  for (;;) {
    const { rows } = await db.execute<Record<string, unknown>>(sql`
      select seq, id, to_char(at at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.US"Z"') as at, actor_id, action, subject,
             details::text as details, ip, prev_hash, row_hash
      from audit_log where seq > ${before?.seq ?? 0} order by seq limit ${BATCH}`);
    if (!rows.length)
      return {
        checked,
        head: before ? { seq: before.seq, rowHash: before.rowHash } : null,
        firstBroken: null,
      };
    for (const raw of rows) {
      const row: ChainRow = {
        seq: Number(raw.seq),
        id: Number(raw.id),
        at: String(raw.at),
        actorId: (raw.actor_id as string | null) ?? null,
        action: String(raw.action),
        subject: (raw.subject as string | null) ?? null,
        details: String(raw.details),
        ip: (raw.ip as string | null) ?? null,
        prevHash: String(raw.prev_hash),
        rowHash: String(raw.row_hash),
      };
      checked++;
      const reason = brokenLink(row, before);
      if (reason)
        return {
          checked,
          head: null,
          firstBroken: { seq: row.seq, id: row.id, at: row.at, action: row.action, reason },
        };
      before = row;
    }
  }
}
