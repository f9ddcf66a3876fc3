// Revisions in a given state for tests that need one without clicking through the review: the
// same steps the API takes (server/modules/review/transitions.ts), in one transaction each, with
// no password asked. The database refuses shortcuts (a revision inserted approved, an approval
// without its signature), so there is no other way.
import { NO_FILES } from '../../server/storage/files';
import { eq } from 'drizzle-orm';
import type { Db } from '../../server/db/client';
import { people, revisions, type RevisionState } from '../../server/db/schema';
import { createProcedure, type NewProcedure } from '../../server/modules/procedures/procedures.service';
import { recordDecision, recordSubmission, recordWithdrawal } from '../../server/modules/review/transitions';

const COMMENT = 'Approved for a test.';
export const CHANGE_REASON = 'Changed for a test.';

async function person(db: Db, who: string) {
  const [p] = await db
    .select()
    .from(people)
    .where(eq(people.email, `${who}@tallowcreek.example`));
  if (!p) throw new Error(`no demo person ${who}`);
  return p;
}

/** Submits a draft as its author (when it is one) and approves it as `reviewer`. */
export async function approveRevision(db: Db, revisionId: string, reviewer = 'marek') {
  const signer = await person(db, reviewer);
  return db.transaction(async (tx) => {
    const [row] = await tx.select().from(revisions).where(eq(revisions.id, revisionId));
    if (row?.state === 'draft') await recordSubmission(tx, row.authorId, revisionId, CHANGE_REASON);
    return recordDecision(tx, NO_FILES, signer, revisionId, 'approved', {
      comment: COMMENT,
      reauthenticated: false,
    });
  });
}

/**
 * A new procedure by `author` whose revision 1 is in `state`: a draft, submitted, approved or
 * returned by `reviewer`, or approved and then withdrawn by them.
 */
export async function procedureInState(
  db: Db,
  state: RevisionState,
  input: NewProcedure,
  opts: { author?: string; reviewer?: string } = {},
) {
  const author = await person(db, opts.author ?? 'hal');
  const reviewer = await person(db, opts.reviewer ?? 'marek');
  return db.transaction(async (tx) => {
    const { procedure, revision } = await createProcedure(tx, author.id, input);
    if (state === 'draft') return { procedure, revision };
    const submitted = await recordSubmission(tx, author.id, revision.id, CHANGE_REASON);
    if (state === 'in_review') return { procedure, revision: submitted };
    const decision = state === 'returned' ? 'returned' : 'approved';
    const decided = await recordDecision(tx, NO_FILES, reviewer, revision.id, decision, {
      comment: decision === 'returned' ? 'Returned for a test.' : COMMENT,
      reauthenticated: false,
    });
    if (state === 'approved' || state === 'returned') return { procedure, revision: decided.revision };
    if (state === 'withdrawn') {
      const withdrawn = await recordWithdrawal(tx, NO_FILES, reviewer, procedure.id, {
        reason: 'Withdrawn for a test.',
        reauthenticated: false,
      });
      return { procedure, revision: withdrawn.revision };
    }
    throw new Error(`a first revision cannot be made ${state}`);
  });
}

/** A one-paragraph document, enough to be submitted. */
export const textDoc = (text: string) => ({
  type: 'doc' as const,
  content: [{ type: 'paragraph', content: [{ type: 'text', text }] }],
});
