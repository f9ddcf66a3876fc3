import { asc, eq } from 'drizzle-orm';
import type { Db, Tx } from '../../db/client';
import { revisions, signatures, type SignatureMeaning } from '../../db/schema';
import type { SignatureView } from '../../../shared/schemas/review';
import { conflict } from '../../http/errors';
import type { FileStore } from '../../storage/files';
import { checkRevisionContent } from './signed-content';

type RevisionRow = typeof revisions.$inferSelect;
type SignatureRow = typeof signatures.$inferSelect;

export interface Signer {
  id: string;
  displayName: string;
  email: string;
}

/**
 * Writes a signature for a revision already moved to the state it means (the database checks
 * that). The hash is taken from the row as stored, inside the same transaction, and from the bytes
 * of its files: an approval over a file that is missing or altered is refused.
 */
export async function signRevision(
  tx: Tx,
  files: FileStore,
  opts: {
    row: RevisionRow;
    signer: Signer;
    role: string;
    meaning: SignatureMeaning;
    comment: string;
    reauthAuditId?: number;
    requestId?: string;
  },
) {
  const content = await checkRevisionContent(tx, files, opts.row);
  if (opts.meaning === 'approved' && !content.intact) {
    throw conflict(
      'A file this revision shows is missing or altered in storage (its bytes no longer match the SHA-256 recorded at upload); it cannot be approved. Tell an admin.',
    );
  }
  const [sig] = await tx
    .insert(signatures)
    .values({
      revisionId: opts.row.id,
      procedureId: opts.row.procedureId,
      revisionNumber: opts.row.number,
      signerId: opts.signer.id,
      signerName: opts.signer.displayName,
      signerEmail: opts.signer.email,
      signerRole: opts.role,
      meaning: opts.meaning,
      comment: opts.comment,
      contentHash: content.hash,
      reauthAuditId: opts.reauthAuditId ?? null,
      requestId: opts.requestId ?? null,
    })
    .returning();
  return sig!;
}

/** Recomputes the content hash of the signed revision as it is stored now, re-hashing its files. */
export async function verifySignature(db: Db | Tx, files: FileStore, sig: SignatureRow) {
  const [row] = await db.select().from(revisions).where(eq(revisions.id, sig.revisionId));
  const current = row ? await checkRevisionContent(db, files, row) : null;
  return {
    verified: !!current?.intact && current.hash === sig.contentHash,
    currentHash: current?.hash ?? null,
  };
}

export const signatureView = (sig: SignatureRow, verified: boolean): SignatureView => ({
  id: sig.id,
  revisionId: sig.revisionId,
  revisionNumber: sig.revisionNumber,
  meaning: sig.meaning,
  signer: { id: sig.signerId, displayName: sig.signerName, role: sig.signerRole },
  comment: sig.comment,
  signedAt: sig.signedAt.toISOString(),
  contentHash: sig.contentHash,
  verified,
});

/** A revision's signatures, oldest first, each verified against the stored revision and its files. */
export async function verifiedSignatures(db: Db, files: FileStore, revisionId: string) {
  const rows = await db
    .select()
    .from(signatures)
    .where(eq(signatures.revisionId, revisionId))
    .orderBy(asc(signatures.signedAt));
  if (!rows.length) return [];
  const [revision] = await db.select().from(revisions).where(eq(revisions.id, revisionId));
  const current = revision ? await checkRevisionContent(db, files, revision) : null;
  return rows.map((s) => signatureView(s, !!current?.intact && s.contentHash === current.hash));
}
