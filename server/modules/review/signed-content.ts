import { inArray } from 'drizzle-orm';
import { extractBlocks } from '../../../shared/document/extract';
import type { Db, Tx } from '../../db/client';
import { attachments, type revisions } from '../../db/schema';
import type { FileStore } from '../../storage/files';
import { canonicalJson, sha256Hex } from './canonical';

type RevisionRow = typeof revisions.$inferSelect;

/** Bump when the shape below changes; old signatures keep verifying under their own version. */
export const HASH_VERSION = 1;

/**
 * Exactly what a sign-off covers: the revision's identity (so a hash copied to another revision
 * fails), its metadata, parameters, document, evaluated snapshot, sanitized HTML, plain text and
 * the SHA-256 of every attached file it shows, taken from the stored bytes on every call (null
 * for a file that is gone or no longer hashes to what its row recorded).
 */
export async function signedContent(db: Db | Tx, store: FileStore, row: RevisionRow) {
  const { images, files } = extractBlocks(row.document);
  const ids = [...new Set([...images, ...files].map((a) => a.attachmentId))].sort();
  const stored = ids.length
    ? await db
        .select({ id: attachments.id, sha256: attachments.sha256 })
        .from(attachments)
        .where(inArray(attachments.id, ids))
    : [];
  const byId = new Map(stored.map((a) => [a.id, a.sha256]));
  const intactHash = async (id: string) => {
    const recorded = byId.get(id);
    return recorded && (await store.exists(recorded)) ? recorded : null;
  };
  return {
    hashVersion: HASH_VERSION,
    revision: { id: row.id, procedureId: row.procedureId, number: row.number },
    metadata: {
      title: row.title,
      equipmentFamily: row.equipmentFamily,
      equipmentModel: row.equipmentModel,
      tags: row.tags,
    },
    params: row.params,
    document: row.document,
    snapshot: row.snapshot,
    html: row.html,
    plainText: row.plainText,
    attachments: await Promise.all(ids.map(async (id) => ({ id, sha256: await intactHash(id) }))),
  };
}

/** The hash a sign-off covers, as the revision and its files are stored now; intact is false when an attached file is missing or altered. */
export async function checkRevisionContent(db: Db | Tx, store: FileStore, row: RevisionRow) {
  const content = await signedContent(db, store, row);
  return {
    hash: sha256Hex(canonicalJson(content)),
    intact: content.attachments.every((a) => a.sha256 !== null),
  };
}

export async function revisionContentHash(db: Db | Tx, store: FileStore, row: RevisionRow) {
  return (await checkRevisionContent(db, store, row)).hash;
}
