import { useAcknowledgementStatus } from '../api/acknowledgements';
import { formatUtc } from './format';

/** For reviewers, beside an approved revision: who must read what changed before running it, and who has. */
export function AcknowledgementStatusPanel({ revisionId }: { revisionId: string }) {
  const query = useAcknowledgementStatus(revisionId);
  const people = query.data?.status.people;
  if (!people) return null;
  const done = people.filter((p) => p.acknowledgedAt).length;
  return (
    <section
      aria-label="Acknowledgements"
      className="flex flex-col gap-2 rounded-lg border border-rule bg-card p-4"
    >
      <h2 className="text-lg font-semibold">Read before you run</h2>
      {people.length === 0 ? (
        <p className="text-sm text-graphite-soft">
          Nobody has to acknowledge this revision: no one ran an earlier revision of this procedure.
        </p>
      ) : (
        <>
          <p className="text-sm">
            <span className="value">{done}</span> of <span className="value">{people.length}</span> who ran an
            earlier revision have acknowledged what changed.
          </p>
          <ul className="flex flex-col divide-y divide-rule text-sm">
            {people.map((p) => (
              <li key={p.id} className="flex flex-wrap items-baseline gap-x-3 py-1">
                <span className="font-semibold">{p.displayName}</span>
                {p.acknowledgedAt ? (
                  <span>
                    acknowledged <time dateTime={p.acknowledgedAt}>{formatUtc(p.acknowledgedAt)}</time>
                    <span className="ml-2 font-mono text-xs break-all text-graphite-soft">
                      {p.contentHash?.slice(0, 12)}…
                    </span>
                  </span>
                ) : (
                  <span className="font-semibold text-out">not yet acknowledged</span>
                )}
              </li>
            ))}
          </ul>
        </>
      )}
    </section>
  );
}
