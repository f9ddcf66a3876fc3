import { asc, eq } from 'drizzle-orm';
import type { Db } from '../../db/client';
import { revisions, signatures, type SignatureMeaning } from '../../db/schema';
import type { SignatureView } from '../../../shared/schemas/review';
import { revisionContentHash } from './signed-content';

type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];
type RevisionRow = typeof revisions.$inferSelect;
type SignatureRow = typeof signatures.$inferSelect;

export interface Signer {
  id: string;
  displayName: string;
  email: string;
}

/**
 * Writes a signature for a revision already moved to the state it means (the database checks
 * that). The hash is taken from the row as stored, inside the same transaction.
 */
export async function signRevision(
  tx: Tx,
  opts: { row: RevisionRow; signer: Signer; role: string; meaning: SignatureMeaning; comment: string; reauthAuditId?: number; requestId?: string },
) {
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
      contentHash: await revisionContentHash(tx, opts.row),
      reauthAuditId: opts.reauthAuditId ?? null,
      requestId: opts.requestId ?? null,
    })
    .returning();
  return sig!;
}


/** Recomputes the content hash of the signed revision as it is stored now. */
export async function verifySignature(db: Db | Tx, sig: SignatureRow) {
  const [row] = await db.select().from(revisions).where(eq(revisions.id, sig.revisionId));
  const currentHash = row ? await revisionContentHash(db, row) : null;
  return { verified: currentHash === sig.contentHash, currentHash };
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

/** A revision's signatures, oldest first, each verified against the stored revision. */
export async function verifiedSignatures(db: Db, revisionId: string) {
  const rows = await db.select().from(signatures).where(eq(signatures.revisionId, revisionId)).orderBy(asc(signatures.signedAt));
  if (!rows.length) return [];
  const [revision] = await db.select().from(revisions).where(eq(revisions.id, revisionId));
  const currentHash = revision ? await revisionContentHash(db, revision) : null;
  return rows.map((s) => signatureView(s, s.contentHash === currentHash));
}
