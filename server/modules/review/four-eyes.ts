import type { revisions } from '../../db/schema';

type Row = Pick<typeof revisions.$inferSelect, 'authorId' | 'editorIds' | 'provenanceIds'>;

/** Whoever wrote or saved this revision (they may submit it). */
export const wroteOrEdited = (userId: string, row: Pick<Row, 'authorId' | 'editorIds'>) =>
  row.authorId === userId || row.editorIds.includes(userId);

/**
 * Four eyes follows provenance: the authors and editors of this revision and of every revision it
 * was started from may not decide on it.
 */
export const countsAsAuthor = (userId: string, row: Row) =>
  wroteOrEdited(userId, row) || row.provenanceIds.includes(userId);

/** Everyone four eyes keeps from deciding on a revision. */
export const authorsOf = (row: Row) => [...new Set([row.authorId, ...row.editorIds, ...row.provenanceIds])];
