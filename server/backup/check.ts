// What an archive can vouch for: every stored file still hashes to the SHA-256 its row recorded,
// and every signature, of a revision or of a run sheet, still verifies against the stored records
// and the stored bytes. Run on the live data before a backup and on the data after a restore.
import { attachments, runSignatures, signatures } from '../db/schema';
import type { Db } from '../db/client';
import { verifiedSignatures } from '../modules/review/signatures';
import { loadRunView } from '../modules/runs/run-view';
import type { FileStore } from '../storage/files';

export interface RecordsCheck {
  files: { checked: number; damaged: { attachmentId: string; fileName: string }[] };
  revisionSignatures: { checked: number; unverified: string[] };
  runSignatures: { checked: number; unverified: string[] };
}

export async function checkRecords(db: Db, files: FileStore): Promise<RecordsCheck> {
  const out: RecordsCheck = {
    files: { checked: 0, damaged: [] },
    revisionSignatures: { checked: 0, unverified: [] },
    runSignatures: { checked: 0, unverified: [] },
  };
  for (const row of await db
    .select({ id: attachments.id, name: attachments.originalName, sha256: attachments.sha256 })
    .from(attachments)) {
    out.files.checked++;
    if (!(await files.exists(row.sha256)))
      out.files.damaged.push({ attachmentId: row.id, fileName: row.name });
  }
  for (const { revisionId } of await db
    .selectDistinct({ revisionId: signatures.revisionId })
    .from(signatures)) {
    for (const sig of await verifiedSignatures(db, files, revisionId)) {
      out.revisionSignatures.checked++;
      if (!sig.verified) out.revisionSignatures.unverified.push(sig.id);
    }
  }
  for (const { runId } of await db.select({ runId: runSignatures.runId }).from(runSignatures)) {
    out.runSignatures.checked++;
    // A release signature must cover the same content hash as the performed signature.
    const view = await loadRunView(db, files, runId);
    if (!view.signature?.verified || view.release?.matchesRun === false)
      out.runSignatures.unverified.push(runId);
  }
  return out;
}

/** The check in lines for a person: counts, then each damaged file and unverified signature. */
export function describeCheck(c: RecordsCheck): string[] {
  return [
    `files: ${c.files.checked} checked, ${c.files.damaged.length} missing or altered`,
    ...c.files.damaged.map((d) => `  NOT VERIFIED: file “${d.fileName}” (attachment ${d.attachmentId})`),
    `revision sign-offs: ${c.revisionSignatures.checked} checked, ${c.revisionSignatures.unverified.length} not verified`,
    ...c.revisionSignatures.unverified.map((id) => `  NOT VERIFIED: signature ${id}`),
    `run sheets: ${c.runSignatures.checked} checked, ${c.runSignatures.unverified.length} not verified`,
    ...c.runSignatures.unverified.map((id) => `  NOT VERIFIED: run ${id}`),
  ];
}
