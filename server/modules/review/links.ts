/** Client paths the server links to from mail; kept in step with src/config/paths.ts. */
export const reviewPagePath = (revisionId: string) => `/review/revisions/${revisionId}`;
export const reviewQueuePath = () => '/review';
