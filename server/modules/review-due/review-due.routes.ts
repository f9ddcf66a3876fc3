import { defineRoute } from '../../http/route';
import { DEFAULT_REVIEW_INTERVAL_MONTHS, dueReviews } from './review-due.service';

export const reviewDueRoutes = [
  defineRoute({
    method: 'get',
    path: '/review/due',
    access: ['reviewer', 'admin'],
    summary:
      'Approved revisions due (within 60 days) or overdue for their periodic review, soonest first; the interval is the shop’s REVIEW_INTERVAL_MONTHS',
    handler: async ({ deps }) => {
      const months = deps.config.reviewIntervalMonths ?? DEFAULT_REVIEW_INTERVAL_MONTHS;
      return { items: await dueReviews(deps.db, months), intervalMonths: months };
    },
  }),
];
