import type { revisions } from '../../db/schema';

/** Four eyes: whoever wrote or saved a revision may not decide on it. */
export const wroteOrEdited = (userId: string, row: Pick<typeof revisions.$inferSelect, 'authorId' | 'editorIds'>) =>
  row.authorId === userId || row.editorIds.includes(userId);
