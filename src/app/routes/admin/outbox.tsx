import { useEffect, useState } from 'react';
import { Problem } from '@/components/errors/problem';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';
import { hasRole, useSession } from '@/features/auth/api/get-session';
import { useOutbox } from '@/features/outbox/api/get-outbox';
import { OutboxTable } from '@/features/outbox/components/outbox-table';

export default function OutboxPage() {
  const session = useSession();
  const isAdmin = hasRole(session.data?.user, 'admin');
  const [status, setStatus] = useState<'' | 'sent' | 'pending'>('');
  const [page, setPage] = useState(1);
  const outbox = useOutbox(status, page);
  useEffect(() => {
    document.title = 'Mail outbox · Benchwright';
  }, []);
  if (!isAdmin) return <Notice tone="error">This page is for admins.</Notice>;
  const pages = outbox.data ? Math.max(1, Math.ceil(outbox.data.total / outbox.data.pageSize)) : 1;
  return (
    <section className="flex flex-col gap-4">
      <h1 className="text-2xl font-semibold">Mail outbox</h1>
      <p className="text-sm text-graphite-soft">
        Mail Benchwright has queued. Messages are kept until the mail server accepts them and retried while it
        is unreachable.
        {outbox.data && (
          <>
            {' '}
            <span className="value">{outbox.data.pending}</span> pending.
          </>
        )}
      </p>
      <label className="flex w-fit flex-col gap-1 text-sm font-semibold">
        Show
        <select
          className="min-h-11 rounded-md border border-rule bg-card px-3 font-normal"
          value={status}
          onChange={(e) => {
            setStatus(e.target.value as typeof status);
            setPage(1);
          }}
        >
          <option value="">All mail</option>
          <option value="pending">Pending</option>
          <option value="sent">Sent</option>
        </select>
      </label>
      {outbox.isError && <Problem error={outbox.error} heading="h2" onRetry={() => void outbox.refetch()} />}
      {outbox.data && <OutboxTable items={outbox.data.items} />}
      {outbox.data && pages > 1 && (
        <nav aria-label="Pages" className="flex items-center gap-3 text-sm">
          <Button
            variant="quiet"
            disabled={page <= 1}
            whyDisabled="These are the newest."
            onClick={() => setPage(page - 1)}
          >
            Newer
          </Button>
          <span>
            Page <span className="value">{page}</span> of <span className="value">{pages}</span>
          </span>
          <Button
            variant="quiet"
            disabled={page >= pages}
            whyDisabled="These are the oldest."
            onClick={() => setPage(page + 1)}
          >
            Older
          </Button>
        </nav>
      )}
    </section>
  );
}
