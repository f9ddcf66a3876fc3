import { lazy, Suspense } from 'react';
import {
  READING_COLUMNS,
  runSheetModel,
  SHEET_HEADINGS,
  type SheetField,
  type SheetNotice,
} from '@shared/runs/run-sheet-model';
import type { RunView } from '@shared/schemas/runs';
import { SafetyCaution } from '@/components/ui/safety-caution';
import { Loading } from '@/components/ui/loading';
import { Mark } from './mark';
import { SafetySign, SignalWord } from '@/components/ui/safety-sign';

// The plot's code (visx) loads only when a sheet is shown, not with the bench screen around it.
const DeviationPlot = lazy(() => import('./deviation-plot'));
const RunReckonerPictures = lazy(() => import('./run-reckoner-pictures'));

const NOTICE_STYLE: Record<SheetNotice['kind'], string> = {
  signed: 'border-ok text-ok',
  'in-progress': 'border-pending bg-pending-wash text-pending',
  abandoned: 'border-out bg-out-wash text-out',
  hold: 'border-out bg-out-wash text-out',
  out: 'border-out bg-out-wash text-out',
};

/** Labelled lines of the sheet (unit, procedure, bench conditions, signature). */
export function Fields({ fields }: { fields: SheetField[] }) {
  return (
    <dl className="mt-2 grid grid-cols-[auto_minmax(0,1fr)] gap-x-3 gap-y-1 text-sm">
      {fields.map((f, i) => (
        <div key={`${f.label}-${i}`} className="contents">
          <dt className="text-graphite-soft">{f.label}</dt>
          <dd
            {...(f.tag ? { [`data-${f.tag}`]: '' } : {})}
            className={[
              'min-w-0 break-words',
              f.mono && 'font-mono break-all',
              f.tone === 'ok' && 'text-ok',
              f.tone === 'out' && 'font-semibold text-out',
            ]
              .filter(Boolean)
              .join(' ')}
          >
            {f.value}
          </dd>
        </div>
      ))}
    </dl>
  );
}

function Card({ title, fields, wide = false }: { title: string; fields: SheetField[]; wide?: boolean }) {
  return (
    <div
      className={`min-w-0 rounded-lg border border-rule bg-card p-4 print:break-inside-avoid ${wide ? 'sm:col-span-2 print:col-span-2' : ''}`}
    >
      <h2 className="font-semibold">{title}</h2>
      <Fields fields={fields} />
    </div>
  );
}

const sub = 'block text-xs text-graphite-soft';

/** The run sheet, from the same model as its PDF: readings with bands, marks and notes, the plot, checks, photos, the people on the run, the signature. */
export function RunSheet({ run }: { run: RunView }) {
  const sheet = runSheetModel(run);
  return (
    <div className="flex flex-col gap-6 print:gap-3 print:text-[11px]">
      <header className="flex flex-col gap-1">
        <h1 className="text-2xl font-semibold print:text-lg">{sheet.title}</h1>
        <p className="text-sm text-graphite-soft">{sheet.reference}</p>
        <div className="flex flex-wrap gap-2">
          {sheet.notices.map((n) => (
            <span
              key={n.kind}
              {...(n.kind === 'out' ? { 'data-run-out': 'true' } : {})}
              {...(n.kind === 'abandoned' ? { 'data-run-abandoned': '' } : {})}
              className={`rounded border px-2 py-0.5 text-sm font-semibold ${NOTICE_STYLE[n.kind]}`}
            >
              {n.kind === 'out' && '▲ '}
              {n.text}
            </span>
          ))}
        </div>
      </header>

      <SafetySign level="danger" as="div" className="print:break-inside-avoid">
        <SafetyCaution caution={sheet.caution} />
      </SafetySign>

      <section className="grid grid-cols-1 gap-4 sm:grid-cols-2 print:grid-cols-2">
        <Card title={SHEET_HEADINGS.unit} fields={sheet.unit} />
        <Card title={SHEET_HEADINGS.bench} fields={sheet.bench} />
        <Card title={SHEET_HEADINGS.procedure} fields={sheet.procedure} wide />
      </section>

      <section>
        <h2 className="mb-2 text-lg font-semibold">{SHEET_HEADINGS.readings}</h2>
        <div className="relative overflow-x-auto rounded-lg border border-rule bg-card">
          <table className="w-full text-left text-sm">
            <thead className="border-b border-rule bg-paper-deep">
              <tr>
                {READING_COLUMNS.map((c) => (
                  <th key={c} className="px-3 py-2">
                    {c}
                  </th>
                ))}
              </tr>
            </thead>
            <tbody>
              {sheet.readings.map((r) => (
                <tr
                  key={r.stepId}
                  data-reading-row={r.stepId}
                  className={`border-b border-rule last:border-0 print:break-inside-avoid ${r.mark === 'out' ? 'bg-out-wash' : ''}`}
                >
                  <td className="px-3 py-2">
                    <span className="value text-graphite-soft">{r.position}.</span> {r.label}
                    <span className={sub}>{r.testPoint}</span>
                    {r.note && (
                      <span data-reading-note className="block italic">
                        Note: {r.note}
                      </span>
                    )}
                  </td>
                  <td className="value px-3 py-2">
                    {r.expected}
                    <span className={sub}>{r.band}</span>
                  </td>
                  <td className="value px-3 py-2">
                    {r.measured}
                    {r.asTyped && <span className={sub}>as typed: {r.asTyped}</span>}
                    {r.corrected && <span className={sub}>(corrected)</span>}
                  </td>
                  <td className="value px-3 py-2">{r.deviation}</td>
                  <td className="px-3 py-2">
                    {r.mark === 'missing' ? (
                      <span className="text-graphite-soft">{r.markText}</span>
                    ) : (
                      <Mark within={r.mark === 'none' ? null : r.mark === 'within'} />
                    )}
                  </td>
                  <td className="px-3 py-2" data-recorded-by>
                    {r.recordedBy ?? '—'}
                    {r.recordedAt && <span className={`value ${sub}`}>{r.recordedAt}</span>}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      </section>

      <section className="print:break-inside-avoid">
        <h2 className="mb-2 text-lg font-semibold">{sheet.plot.title}</h2>
        <Suspense fallback={<Loading what="the plot" lines={3} />}>
          <DeviationPlot plot={sheet.plot} />
        </Suspense>
      </section>

      <Suspense fallback={null}>
        <RunReckonerPictures run={run} />
      </Suspense>

      <section>
        <h2 className="mb-2 text-lg font-semibold">{SHEET_HEADINGS.checks}</h2>
        <ol className="flex flex-col gap-1 text-sm">
          {sheet.checks.map((c) => (
            <li key={c.stepId} className="flex gap-2 print:break-inside-avoid">
              <span className={`value ${c.done ? 'text-ok' : 'text-out'}`}>{c.done ? '✓' : '✗'}</span>
              <span>
                <span className="value text-graphite-soft">{c.position}.</span>{' '}
                {c.signal && <SignalWord level={c.signal} size="sm" />} {c.text}{' '}
                <span className="text-graphite-soft">— {c.status}</span>
                {c.note && <span className="block italic">Note: {c.note}</span>}
              </span>
            </li>
          ))}
        </ol>
      </section>

      {sheet.decisions.length > 0 && (
        <section data-sheet-decisions className="rounded-lg border border-rule bg-card p-4">
          <h2 className="font-semibold">{SHEET_HEADINGS.decisions}</h2>
          <Fields fields={sheet.decisions} />
        </section>
      )}

      {sheet.instruments.length > 0 && (
        <section
          data-sheet-instruments
          className="rounded-lg border border-rule bg-card p-4 print:break-inside-avoid"
        >
          <h2 className="font-semibold">{SHEET_HEADINGS.instruments}</h2>
          <Fields fields={sheet.instruments} />
        </section>
      )}

      {sheet.corrections.length > 0 && (
        <section>
          <h2 className="mb-2 text-lg font-semibold">{SHEET_HEADINGS.corrections}</h2>
          <ul className="flex flex-col gap-2 text-sm">
            {sheet.corrections.map((c) => (
              <li key={c.stepId}>
                <strong>
                  {c.position}. {c.text}
                </strong>
                <ul className="ml-5 list-disc">
                  {c.versions.map((v) => (
                    <li key={v}>{v}</li>
                  ))}
                </ul>
              </li>
            ))}
          </ul>
        </section>
      )}

      {run.photos.length > 0 && (
        <section>
          <h2 className="mb-2 text-lg font-semibold">Photos</h2>
          <div className="flex flex-wrap gap-3">
            {run.photos.map((p) => (
              <figure key={p.id} className="w-40 print:break-inside-avoid">
                <img
                  src={p.url}
                  alt={`Bench photo${p.stepId ? ` for step ${run.steps.find((s) => s.id === p.stepId)?.position}` : ''}`}
                  className="h-32 w-40 rounded border border-rule object-cover"
                />
                <figcaption className="text-xs text-graphite-soft">
                  {p.stepId ? `Step ${run.steps.find((s) => s.id === p.stepId)?.position}` : 'Run'} ·{' '}
                  {p.addedBy.displayName}
                </figcaption>
              </figure>
            ))}
          </div>
        </section>
      )}

      {sheet.followUp.length > 0 && (
        <section className="rounded-lg border border-rule bg-card p-4 print:break-inside-avoid">
          <h2 className="font-semibold">{SHEET_HEADINGS.followUp}</h2>
          <Fields fields={sheet.followUp} />
        </section>
      )}

      <section className="rounded-lg border border-rule bg-card p-4 print:break-inside-avoid">
        <h2 className="font-semibold">{SHEET_HEADINGS.signature}</h2>
        <Fields fields={sheet.signature} />
      </section>

      <section className="rounded-lg border border-rule bg-card p-4 print:break-inside-avoid">
        <h2 className="font-semibold">{SHEET_HEADINGS.release}</h2>
        <Fields fields={sheet.release} />
      </section>
    </div>
  );
}
