import { useEffect } from 'react';
import { Loading } from '@/components/ui/loading';
import { FollowUpCard } from '@/features/follow-ups/components/follow-up-card';
import { useFollowUps } from '@/features/follow-ups/api/follow-ups';

/** Every follow-up of out-of-band readings, open ones first. */
export default function FollowUpsPage() {
  const list = useFollowUps();
  useEffect(() => {
    document.title = 'Follow-ups · Benchwright';
  }, []);
  if (list.isPending) return <Loading />;
  if (list.isError) throw list.error;
  const all = list.data.followUps;
  const open = all.filter((f) => !f.closed);
  const closed = all.filter((f) => f.closed);
  return (
    <section className="flex flex-col gap-4">
      <header>
        <h1 className="text-2xl font-semibold">Follow-ups</h1>
        <p className="text-sm text-graphite-soft">
          A signed run with out-of-band readings opens a follow-up. It closes when a later run of the same
          procedure on the unit is signed with every reading in band, when a reviewer accepts the readings
          with a reason, or when the unit is returned unrepaired.
        </p>
      </header>
      <h2 className="text-lg font-semibold">
        Open <span className="value">({open.length})</span>
      </h2>
      {open.length ? (
        open.map((f) => <FollowUpCard key={f.id} followUp={f} />)
      ) : (
        <p className="text-sm text-graphite-soft">No open follow-ups.</p>
      )}
      <h2 className="text-lg font-semibold">
        Closed <span className="value">({closed.length})</span>
      </h2>
      {closed.length ? (
        closed.map((f) => <FollowUpCard key={f.id} followUp={f} />)
      ) : (
        <p className="text-sm text-graphite-soft">None closed yet.</p>
      )}
    </section>
  );
}
