import { useEffect } from 'react';
import { Link } from 'react-router-dom';
import { paths } from '@/config/paths';
import { Problem } from '@/components/errors/problem';
import { Notice } from '@/components/ui/notice';
import { hasRole, useSession } from '@/features/auth/api/get-session';
import { useReviewQueue } from '@/features/review/api/review-queries';
import { QueueTable } from '@/features/review/components/queue-table';
import { Loading } from '@/components/ui/loading';

export default function ReviewQueuePage() {
  const session = useSession();
  const isReviewer = hasRole(session.data?.user, 'reviewer');
  const queue = useReviewQueue();
  useEffect(() => {
    document.title = 'Review queue · Benchwright';
  }, []);
  if (!isReviewer) return <Notice tone="error">The review queue is for reviewers.</Notice>;
  return (
    <section className="flex flex-col gap-4">
      <h1 className="text-2xl font-semibold">Review queue</h1>
      <p className="text-sm text-graphite-soft">
        Revisions submitted for review, oldest first. Open one to see what changed and sign your decision.{' '}
        <Link to={paths.reviewDue.href()} className="text-accent underline">
          Procedures due for periodic review
        </Link>
      </p>
      {queue.isPending && <Loading />}
      {queue.isError && <Problem error={queue.error} heading="h2" onRetry={() => void queue.refetch()} />}
      {queue.data && <QueueTable items={queue.data.items} />}
    </section>
  );
}
