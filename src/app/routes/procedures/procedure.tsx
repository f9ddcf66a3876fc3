import { useEffect } from 'react';
import { Link, useParams } from 'react-router-dom';
import { paths } from '@/config/paths';
import { hasRole, useSession } from '@/features/auth/api/get-session';
import { useProcedure } from '@/features/procedures/api/get-procedure';
import { StateBadge } from '@/features/procedures/components/state-badge';
import { Loading } from '@/components/ui/loading';
import { StartDraftButton } from '@/features/procedures/components/start-draft-button';

/** One procedure and its revisions, newest first. */
export default function ProcedurePage() {
  const { procedureId = '' } = useParams();
  const session = useSession();
  const query = useProcedure(procedureId);
  const isAuthor = hasRole(session.data?.user, 'author');
  useEffect(() => {
    document.title = `${query.data?.procedure.title ?? 'Procedure'} · Benchwright`;
  }, [query.data?.procedure.title]);
  if (!query.data) {
    if (query.isError) throw query.error;
    return <Loading />;
  }
  const { procedure, revisions } = query.data;
  return (
    <section className="flex flex-col gap-4">
      <p className="text-sm text-graphite-soft">
        {procedure.equipmentFamily} ·{' '}
        <span className="font-semibold text-graphite">{procedure.equipmentModel}</span>
      </p>
      <h1 className="text-2xl font-semibold">{procedure.title}</h1>
      {procedure.tags.length > 0 && (
        <p className="text-xs text-graphite-soft">Tags: {procedure.tags.join(', ')}</p>
      )}
      <h2 className="text-lg font-semibold">Revisions</h2>
      <ul className="flex flex-col divide-y divide-rule rounded-lg border border-rule bg-card">
        {[...revisions].reverse().map((r) => (
          <li key={r.id} className="flex flex-wrap items-center gap-3 px-4 py-3">
            <Link to={paths.revision.href(r.id)} className="font-semibold text-accent-deep underline">
              Revision <span className="value">{r.number}</span>
            </Link>
            <StateBadge state={r.state} />
            <span className="text-sm">by {r.author.displayName}</span>
            <time className="text-sm text-graphite-soft" dateTime={r.updatedAt}>
              {new Date(r.updatedAt).toLocaleString()}
            </time>
            {isAuthor && r.state === 'draft' && (
              <Link
                to={paths.editRevision.href(r.id)}
                className="ml-auto rounded-md border border-accent-deep bg-accent px-3 py-2 text-sm font-semibold text-white"
              >
                Edit
              </Link>
            )}
            {isAuthor && r.state === 'returned' && (
              <span className="ml-auto flex flex-wrap items-center gap-2">
                <StartDraftButton revision={{ ...r, procedureId: procedure.id }} />
              </span>
            )}
            {r.changeReason && (
              <p className="w-full text-sm break-words text-graphite-soft">Change reason: {r.changeReason}</p>
            )}
          </li>
        ))}
      </ul>
    </section>
  );
}
