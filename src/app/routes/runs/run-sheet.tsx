import { useEffect } from 'react';
import { Link, useParams } from 'react-router-dom';
import { paths } from '@/config/paths';
import { useRun } from '@/features/runs/api/get-run';
import { RunSheet } from '@/features/runs/components/run-sheet';
import { Loading } from '@/components/ui/loading';

export default function RunSheetPage() {
  const { runId = '' } = useParams();
  const run = useRun(runId);
  useEffect(() => {
    if (run.data)
      document.title = `Run sheet: ${run.data.run.unit.model} ${run.data.run.unit.serial} · Benchwright`;
  }, [run.data]);
  if (run.isPending) return <Loading />;
  if (!run.data) throw run.error;
  const r = run.data.run;
  return (
    <section className="flex flex-col gap-4">
      <div className="flex flex-wrap gap-2 print:hidden">
        {r.status !== 'signed' && (
          <Link
            to={paths.run.href(r.id)}
            className="inline-flex min-h-12 items-center rounded-md border border-rule bg-card px-4 font-semibold"
          >
            Back to the bench
          </Link>
        )}
        <button
          type="button"
          onClick={() => window.print()}
          className="min-h-12 rounded-md border border-rule bg-card px-4 font-semibold"
        >
          Print
        </button>
        <a
          href={`/api/runs/${r.id}/sheet.pdf`}
          download
          className="inline-flex min-h-12 items-center rounded-md border border-accent-deep bg-accent px-4 font-semibold text-white"
        >
          Download PDF
        </a>
      </div>
      <RunSheet run={r} />
    </section>
  );
}
