import { Link } from 'react-router-dom';
import { paths } from '@/config/paths';
import type { PartialHit, SearchHit } from '@shared/schemas/search';
import { Snippet } from './snippet';

/** One group of search results; a partial hit also says which of the query's words it lacks. */
export function ResultList({
  hits,
  label,
  dim,
}: {
  hits: (SearchHit | PartialHit)[];
  label: string;
  dim?: boolean;
}) {
  return (
    <ol aria-label={label} className={`flex flex-col gap-3 ${dim ? 'opacity-70' : ''}`}>
      {hits.map((h) => (
        <li key={h.procedureId} className="rounded-lg border border-rule bg-card p-4">
          <Link
            to={paths.revision.href(h.revisionId)}
            className="text-lg font-semibold text-accent-deep underline-offset-2 hover:underline"
          >
            {h.title}
          </Link>
          <div className="text-xs text-graphite-soft">
            {h.family} · {h.model} · revision {h.revisionNumber} · {h.tags.join(', ')}
          </div>
          {'missing' in h && h.missing.length > 0 && (
            <div className="text-xs text-graphite-soft">
              Does not mention: <span className="font-semibold">{h.missing.join(', ')}</span>
            </div>
          )}
          <p className="mt-2 text-sm">
            <Snippet parts={h.snippet} />
          </p>
        </li>
      ))}
    </ol>
  );
}
