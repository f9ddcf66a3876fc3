import { inArray } from 'drizzle-orm';
import { extractBlocks } from '../../../shared/document/extract';
import type { Db } from '../../db/client';
import { attachments, type revisions } from '../../db/schema';
import { canonicalJson, sha256Hex } from './canonical';

type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];
type RevisionRow = typeof revisions.$inferSelect;

/** Bump when the shape below changes; old signatures keep verifying under their own version. */
export const HASH_VERSION = 1;

/**
 * Exactly what a sign-off covers: the revision's identity (so a hash copied to another revision
 * fails), its metadata, parameters, document, evaluated snapshot, sanitized HTML, plain text and
 * the SHA-256 of every attached file it shows.
 */
export async function signedContent(db: Db | Tx, row: RevisionRow) {
  const { images, files } = extractBlocks(row.document);
  const ids = [...new Set([...images, ...files].map((a) => a.attachmentId))].sort();
  const stored = ids.length ? await db.select({ id: attachments.id, sha256: attachments.sha256 }).from(attachments).where(inArray(attachments.id, ids)) : [];
  const byId = new Map(stored.map((a) => [a.id, a.sha256]));
  return {
    hashVersion: HASH_VERSION,
    revision: { id: row.id, procedureId: row.procedureId, number: row.number },
    metadata: { title: row.title, equipmentFamily: row.equipmentFamily, equipmentModel: row.equipmentModel, tags: row.tags },
    params: row.params,
    document: row.document,
    snapshot: row.snapshot,
    html: row.html,
    plainText: row.plainText,
    attachments: ids.map((id) => ({ id, sha256: byId.get(id) ?? null })),
  };
}

export async function revisionContentHash(db: Db | Tx, row: RevisionRow) {
  return sha256Hex(canonicalJson(await signedContent(db, row)));
}
