import { useEffect } from 'react';
import { Link, useParams } from 'react-router-dom';
import { Button } from '@/components/ui/button';
import { Loading } from '@/components/ui/loading';
import { Notice } from '@/components/ui/notice';
import { RegionBoundary } from '@/components/errors/region-boundary';
import { paths } from '@/config/paths';
import { useAcknowledge, useAcknowledgement } from '@/features/review/api/acknowledgements';
import { ChangeReason } from '@/features/review/components/change-reason';
import { formatUtc } from '@/features/review/components/format';
import { TextDiffView } from '@/features/review/components/text-diff-view';
import { ValueChangesTable } from '@/features/review/components/value-changes-table';

/**
 * Read before you run: what changed in a newly approved revision (the review's diff, in words and
 * numbers), and the technician's acknowledgement over the content hash shown.
 */
export default function AcknowledgePage() {
  const { revisionId = '' } = useParams();
  const query = useAcknowledgement(revisionId);
  const acknowledge = useAcknowledge(revisionId);
  const a = query.data?.acknowledgement;
  useEffect(() => {
    document.title = `What changed: ${a?.revision.title ?? 'revision'} · Benchwright`;
  }, [a?.revision.title]);
  if (!a) {
    if (query.isError) throw query.error;
    return <Loading />;
  }
  const r = a.revision;
  return (
    <article className="mx-auto flex max-w-5xl flex-col gap-6">
      <header className="flex flex-col gap-2 border-b border-rule pb-4">
        <p className="text-sm text-graphite-soft">Read before you run · {r.equipmentModel}</p>
        <h1 className="text-2xl font-semibold break-words">
          What changed in revision <span className="value">{r.number}</span> of {r.title}
        </h1>
        <ChangeReason reason={r.changeReason} />
        <p className="text-sm">
          {a.base ? (
            <>
              Compared with{' '}
              <Link to={paths.revision.href(a.base.id)} className="text-accent underline">
                revision {a.base.number}
              </Link>
              , the one approved before it.
            </>
          ) : (
            'The first approved revision of this procedure.'
          )}{' '}
          <Link to={paths.revision.href(r.id)} className="text-accent underline">
            Read the whole revision
          </Link>
        </p>
      </header>

      <section className="flex flex-col gap-2">
        <h2 className="text-xl font-semibold">Changed values</h2>
        <ValueChangesTable changes={a.valueChanges} />
      </section>
      <section className="flex flex-col gap-2">
        <h2 className="text-xl font-semibold">Changed text</h2>
        <RegionBoundary label="Changed text">
          <TextDiffView lines={a.textDiff} />
        </RegionBoundary>
      </section>

      <section
        aria-label="Acknowledgement"
        className="flex flex-col gap-3 rounded-lg border border-rule bg-paper-deep p-4"
      >
        {a.acknowledgement ? (
          <Notice tone="success">
            You acknowledged revision {r.number} on {formatUtc(a.acknowledgement.acknowledgedAt)}.{' '}
            <Link className="font-semibold underline" to={paths.newRun.href(undefined, r.id)}>
              Start a bench run on it
            </Link>
          </Notice>
        ) : (
          <>
            <p className="text-sm">
              {a.required
                ? `You ran an earlier revision of this procedure. Read what changed above; your acknowledgement is needed before your first run on revision ${r.number}.`
                : 'You have not run an earlier revision of this procedure, so no acknowledgement is needed; you may still record one.'}{' '}
              Benchwright records your name, the time and the revision’s content hash:
            </p>
            <p className="font-mono text-xs break-all text-graphite-soft">{r.contentHash}</p>
            <Button
              className="self-start"
              disabled={acknowledge.isPending}
              onClick={() => acknowledge.mutate(r.contentHash)}
            >
              {acknowledge.isPending ? 'Recording…' : 'I have read what changed'}
            </Button>
            {acknowledge.error && <Notice tone="error">{acknowledge.error.message}</Notice>}
          </>
        )}
      </section>
    </article>
  );
}
