import { useEffect } from 'react';
import { Link, useParams } from 'react-router-dom';
import { REVISION_STATE_LABELS } from '@shared/schemas/revision-states';
import { RegionBoundary } from '@/components/errors/region-boundary';
import { Notice } from '@/components/ui/notice';
import { SafetyCaution } from '@/components/ui/safety-caution';
import { paths } from '@/config/paths';
import { hasRole, useSession } from '@/features/auth/api/get-session';
import { useRevision } from '@/features/procedures/api/get-revision';
import { DocumentView } from '@/features/procedures/components/reader/document-view';
import { RevisionActions } from '@/features/procedures/components/revision-actions';
import { RevisionReviewPanel } from '@/features/review/components/revision-review-panel';
import { StateBadge } from '@/features/procedures/components/state-badge';
import { SafetySign } from '@/components/ui/safety-sign';
import { Loading } from '@/components/ui/loading';
import { ChangeReason } from '@/features/review/components/change-reason';
import { useAcknowledgement } from '@/features/review/api/acknowledgements';
import { AcknowledgementStatusPanel } from '@/features/review/components/acknowledgement-status';
import { BenchSheetForm } from '@/features/paper-sheets/components/bench-sheet-form';

/** Reading one revision: header, the standing caution, the document with its stored results. */
export default function RevisionPage() {
  const { revisionId = '' } = useParams();
  const session = useSession();
  const query = useRevision(revisionId);
  const r = query.data?.revision;
  const user = session.data?.user;
  const isTechnician = hasRole(user, 'technician');
  const ack = useAcknowledgement(revisionId, isTechnician && r?.state === 'approved');
  useEffect(() => {
    document.title = `${r?.title ?? 'Procedure'} · Benchwright`;
  }, [r?.title]);

  if (!r) {
    // Nothing to show: the route's error boundary says why, with a way back.
    if (query.isError) throw query.error;
    return <Loading />;
  }
  return (
    <article className="reader mx-auto flex max-w-4xl flex-col gap-4">
      <header className="flex flex-col gap-2 border-b border-rule pb-4">
        <p className="text-sm text-graphite-soft">
          {r.equipmentFamily} · <span className="font-semibold text-graphite">{r.equipmentModel}</span>
        </p>
        <h1 className="text-3xl font-semibold">{r.title}</h1>
        <p className="flex flex-wrap items-center gap-x-3 gap-y-1 text-sm">
          <span>
            Revision <span className="value">{r.number}</span>
          </span>
          <StateBadge state={r.state} />
          <span className="sr-only">State: {REVISION_STATE_LABELS[r.state]}</span>
          <span>by {r.author.displayName}</span>
          <span>
            last changed <time dateTime={r.updatedAt}>{new Date(r.updatedAt).toLocaleString()}</time>
          </span>
          <span className="text-graphite-soft">
            mains <span className="value">{r.params.mainsNominal} V</span>,{' '}
            <span className="value">{r.params.mainsFrequency} Hz</span>
          </span>
        </p>
        {r.tags.length > 0 && <p className="text-xs text-graphite-soft">Tags: {r.tags.join(', ')}</p>}
        <ChangeReason reason={r.changeReason} />
        <RevisionActions revision={r} isAuthor={hasRole(session.data?.user, 'author')} />
        {ack.data?.acknowledgement.required && (
          <Notice tone="info">
            Revision {r.number} changed the procedure you ran before. Read what changed before your first run
            on it:{' '}
            <Link className="font-semibold underline" to={paths.acknowledgeRevision.href(r.id)}>
              read and acknowledge
            </Link>
          </Notice>
        )}
        {r.state === 'approved' && isTechnician && (
          <p>
            <Link
              to={paths.newRun.href(undefined, r.id)}
              className="inline-flex min-h-12 items-center rounded-md border border-accent-deep bg-accent px-4 font-semibold text-white hover:bg-accent-deep"
            >
              Start a bench run on this revision
            </Link>
          </p>
        )}
        {r.state === 'approved' && <BenchSheetForm revisionId={r.id} params={r.params} />}
        <RegionBoundary label="Review and sign-offs">
          <RevisionReviewPanel revision={r} />
        </RegionBoundary>
        {['approved', 'superseded'].includes(r.state) && hasRole(user, 'reviewer', 'admin') && (
          <RegionBoundary label="Acknowledgements">
            <AcknowledgementStatusPanel revisionId={r.id} />
          </RegionBoundary>
        )}
      </header>
      {r.state !== 'approved' && (
        <Notice tone="info">
          This revision is {REVISION_STATE_LABELS[r.state].toLowerCase()}, not the approved procedure: do not
          use it at the bench.
        </Notice>
      )}
      <SafetySign level="danger" as="div">
        <SafetyCaution />
      </SafetySign>
      <RegionBoundary label="Procedure text">
        <DocumentView doc={r.document} snapshot={r.snapshot} reckoners={r.reckoners} />
      </RegionBoundary>
    </article>
  );
}
