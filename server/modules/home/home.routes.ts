import { defineRoute } from '../../http/route';
import { DEFAULT_REVIEW_INTERVAL_MONTHS } from '../review-due/review-due.service';
import { homeView } from './home.service';

export const homeRoutes = [
  defineRoute({
    method: 'get',
    path: '/home',
    access: 'signed-in',
    summary:
      'What waits for the caller, by their roles: their runs in progress, runs to co-sign as witness, revisions to acknowledge, reviews, their drafts and returned revisions, reviews due, instruments falling due; each with a count and the first few items',
    handler: async ({ user, deps }) =>
      homeView(deps.db, user!, {
        months: deps.config.reviewIntervalMonths ?? DEFAULT_REVIEW_INTERVAL_MONTHS,
        files: deps.files,
      }),
  }),
];
