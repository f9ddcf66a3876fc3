import { existsSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { and, eq } from 'drizzle-orm';
import { z } from 'zod';
import type { ProcedureDoc } from '../../shared/document/schema';
import { toSessionUser } from '../auth/passport';
import { checkDocument } from '../modules/procedures/document-check';
import { saveDraft, startNextDraft } from '../modules/procedures/procedures.service';
import { recordDecision, recordSubmission } from '../modules/review/transitions';
import { NO_FILES } from '../storage/files';
import type { Db } from './client';
import { people, procedures, revisions } from './schema';

const revisionsFile = z.object({
  note: z.string().optional(),
  revisions: z.array(
    z.object({
      procedure: z.string(),
      number: z.number().int().min(2),
      author: z.string(),
      reviewer: z.string(),
      changeReason: z.string().min(1),
      /** Reading attributes changed in this revision, by reading id. */
      readings: z.record(z.string(), z.object({ tolerance: z.string() }).partial()),
      comment: z.string(),
    }),
  ),
});

export function readDemoRevisions(dir: string) {
  const file = path.join(dir, 'revisions.json');
  if (!existsSync(file)) return [];
  return revisionsFile.parse(JSON.parse(readFileSync(file, 'utf8'))).revisions;
}

/** The document with the named readings' attributes replaced. */
function patchReadings(doc: ProcedureDoc, changes: Record<string, Record<string, string | undefined>>) {
  const walk = (node: unknown): unknown => {
    if (Array.isArray(node)) return node.map(walk);
    if (!node || typeof node !== 'object') return node;
    const n = node as { type?: string; attrs?: Record<string, unknown>; content?: unknown };
    const change = n.type === 'reading' && typeof n.attrs?.id === 'string' ? changes[n.attrs.id] : undefined;
    return {
      ...n,
      ...(change ? { attrs: { ...n.attrs, ...change } } : {}),
      ...(n.content ? { content: walk(n.content) } : {}),
    };
  };
  return walk(doc);
}

/**
 * Later demo revisions, by the API's steps: the next draft from the approved one, saved with the
 * change, submitted with its reason and approved by the reviewer. A procedure that already has the
 * numbered revision is left as it is.
 */
export async function seedDemoRevisions(db: Db, dir: string) {
  let added = 0;
  let present = 0;
  for (const r of readDemoRevisions(dir)) {
    const [procedure] = await db.select().from(procedures).where(eq(procedures.seedKey, r.procedure));
    if (!procedure) throw new Error(`demo revision of ${r.procedure}: no such procedure`);
    const [there] = await db
      .select({ id: revisions.id })
      .from(revisions)
      .where(and(eq(revisions.procedureId, procedure.id), eq(revisions.number, r.number)));
    if (there) {
      present++;
      continue;
    }
    const [author] = await db.select().from(people).where(eq(people.email, r.author));
    const [reviewer] = await db.select().from(people).where(eq(people.email, r.reviewer));
    if (!author || !reviewer)
      throw new Error(`demo revision of ${r.procedure}: no person ${r.author} or ${r.reviewer}`);
    const user = toSessionUser(author);
    const draft = await startNextDraft(db, user, procedure.id);
    if (draft.number !== r.number)
      throw new Error(`demo revision of ${r.procedure}: the next draft is ${draft.number}, not ${r.number}`);
    const checked = checkDocument(patchReadings(draft.document, r.readings));
    if (!checked.ok)
      throw new Error(`demo revision of ${r.procedure}: ${checked.problems.map((p) => p.reason).join('; ')}`);
    await saveDraft(
      db,
      user,
      draft.id,
      {
        title: draft.title,
        equipmentFamily: draft.equipmentFamily,
        equipmentModel: draft.equipmentModel,
        tags: draft.tags,
        params: draft.params,
        lockVersion: draft.lockVersion,
        document: checked.doc,
      },
      checked.doc,
    );
    await db.transaction(async (tx) => {
      await recordSubmission(tx, author.id, draft.id, r.changeReason);
      await recordDecision(tx, NO_FILES, reviewer, draft.id, 'approved', {
        comment: r.comment,
        reauthenticated: false,
      });
    });
    added++;
  }
  return { added, present };
}
