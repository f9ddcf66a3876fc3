/** Revision states with their labels; kept free of zod so the reader bundle stays small. */
export const REVISION_STATE_LABELS = {
  draft: 'Draft',
  in_review: 'In review',
  approved: 'Approved',
  returned: 'Returned',
  superseded: 'Superseded',
  withdrawn: 'Withdrawn',
} as const;
export type RevisionStateName = keyof typeof REVISION_STATE_LABELS;
