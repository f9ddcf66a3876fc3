/** Periodic review: each approved revision is looked at again by a date (the shop's interval after approval). */

/** Listed from this many days before the date. */
export const REVIEW_DUE_SOON_DAYS = 60;

export interface ReviewDueItem {
  revisionId: string;
  procedureId: string;
  title: string;
  equipmentModel: string;
  number: number;
  approvedAt: string;
  dueAt: string;
  /** overdue: the date has passed; due: it falls within the next REVIEW_DUE_SOON_DAYS days. */
  status: 'overdue' | 'due';
}
