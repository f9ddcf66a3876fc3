import { paths } from '../../../shared/paths';

/** Client pages the server links to from mail (patterns defined once, in shared/paths.ts). */
export const reviewPagePath = (revisionId: string) => paths.reviewRevision.href(revisionId);
export const reviewQueuePath = () => paths.reviewQueue.href();
