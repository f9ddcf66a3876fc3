import type { RunView } from '@shared/schemas/runs';
import { formatNumber, formatQuantity } from '@shared/units';
import { SafetyCaution } from '@/components/ui/safety-caution';
import { DeviationPlot } from './deviation-plot';
import { Mark } from './mark';

const utc = (iso: string | null) => (iso ? `${iso.slice(0, 19).replace('T', ' ')} UTC` : '—');

function HandoverRow({ h }: { h: RunView['handovers'][number] }) {
  return (
    <>
      <dt className="text-graphite-soft">Handed over</dt>
      <dd data-handover>
        <span className="value">{utc(h.at)}</span>: {h.from.displayName} handed the run over to{' '}
        {h.to.displayName}
        {h.by.id !== h.from.id && ` (reassigned by ${h.by.displayName})`}. Reason: {h.reason}
      </dd>
    </>
  );
}

/** The run sheet: readings with their bands and marks and who recorded them, the plot, checks, photos, the people on the run, signatures. */
export function RunSheet({ run }: { run: RunView }) {
  const entries = new Map(run.entries.map((e) => [e.stepId, e]));
  const readings = run.steps.filter((s) => s.kind === 'reading');
  const ticks = run.steps.filter((s) => s.kind !== 'reading');
  const corrected = run.entries.filter((e) => e.history.length > 1);
  return (
    <div className="flex flex-col gap-6 print:gap-3 print:text-[11px]">
      <header className="flex flex-col gap-1">
        <h1 className="text-2xl font-semibold print:text-lg">Run sheet: {run.title}</h1>
        <p className="text-sm text-graphite-soft">
          {run.unit.model} · serial <span className="value">{run.unit.serial}</span>
          {run.unit.owner && ` · ${run.unit.owner}`}
          {run.unit.jobNumber && (
            <>
              {' '}
              · job <span className="value">{run.unit.jobNumber}</span>
            </>
          )}
        </p>
        <div className="flex flex-wrap gap-2">
          {run.status === 'signed' ? (
            <span className="rounded border border-ok px-2 py-0.5 text-sm font-semibold text-ok">Signed</span>
          ) : run.status === 'abandoned' ? (
            <span
              data-run-abandoned
              className="rounded border border-out bg-out-wash px-2 py-0.5 text-sm font-semibold text-out"
            >
              Closed as abandoned, not signed
            </span>
          ) : (
            <span className="rounded border border-hazard-ink bg-hazard px-2 py-0.5 text-sm font-semibold text-hazard-ink">
              Not signed: bench run in progress
            </span>
          )}
          {run.hold && (
            <span className="rounded border border-out bg-out-wash px-2 py-0.5 text-sm font-semibold text-out">
              On hold: revision withdrawn
            </span>
          )}
          {run.outOfTolerance && (
            <span
              data-run-out="true"
              className="rounded border border-out bg-out-wash px-2 py-0.5 text-sm font-semibold text-out"
            >
              ▲ {run.progress.outOfTolerance} reading{run.progress.outOfTolerance === 1 ? '' : 's'} out of
              tolerance
            </span>
          )}
        </div>
      </header>

      <section className="rounded-md border-2 border-hazard-ink bg-hazard/30 p-3">
        <SafetyCaution />
      </section>

      <section className="grid gap-4 sm:grid-cols-2 print:grid-cols-2">
        <div className="rounded-lg border border-rule bg-card p-4">
          <h2 className="font-semibold">Procedure followed</h2>
          <dl className="mt-2 grid grid-cols-[auto_1fr] gap-x-3 gap-y-1 text-sm">
            <dt className="text-graphite-soft">Revision</dt>
            <dd>
              {run.revision.number} ({run.revision.state.replace('_', ' ')})
            </dd>
            <dt className="text-graphite-soft">Approved</dt>
            <dd className="value">{utc(run.revision.approvedAt)}</dd>
            <dt className="text-graphite-soft">Author</dt>
            <dd>{run.revision.author.displayName}</dd>
            <dt className="text-graphite-soft">Reviewer sign-off</dt>
            <dd>
              {run.revision.signOffs.length
                ? run.revision.signOffs.map((s) => (
                    <span key={s.signedAt} className="block">
                      {s.name}, {s.meaning}, <span className="value">{utc(s.signedAt)}</span>
                    </span>
                  ))
                : 'none recorded for this revision'}
            </dd>
            <dt className="text-graphite-soft">Content SHA-256</dt>
            <dd className="value truncate text-xs" title={run.revision.contentHash}>
              {run.revision.contentHash}
            </dd>
          </dl>
        </div>
        <div className="rounded-lg border border-rule bg-card p-4">
          <h2 className="font-semibold">Bench conditions</h2>
          <dl className="mt-2 grid grid-cols-[auto_1fr] gap-x-3 gap-y-1 text-sm">
            <dt className="text-graphite-soft">Measured mains</dt>
            <dd className="value">{formatQuantity(run.params.mainsVoltage, 'V', 4)}</dd>
            <dt className="text-graphite-soft">Frequency</dt>
            <dd className="value">{formatQuantity(run.params.mainsFrequency, 'Hz', 3)}</dd>
            <dt className="text-graphite-soft">Procedure nominal</dt>
            <dd className="value">{formatQuantity(run.params.mainsNominal, 'V', 4)}</dd>
            <dt className="text-graphite-soft">Started</dt>
            <dd>
              <span className="value">{utc(run.startedAt)}</span> by {run.startedBy.displayName}
            </dd>
            {run.handovers.map((h) => (
              <HandoverRow key={h.at + h.to.id} h={h} />
            ))}
            {run.status === 'in_progress' && (
              <>
                <dt className="text-graphite-soft">Performed by</dt>
                <dd data-performer>{run.performedBy.displayName}</dd>
              </>
            )}
            {run.closed && (
              <>
                <dt className="text-graphite-soft">Closed</dt>
                <dd>
                  <span className="value">{utc(run.closed.at)}</span> by {run.closed.by.displayName}, as
                  abandoned: {run.closed.reason}
                </dd>
              </>
            )}
            {run.hold && (
              <>
                <dt className="text-graphite-soft">On hold</dt>
                <dd className="text-out">
                  revision {run.hold.revisionNumber} withdrawn by {run.hold.by},{' '}
                  <span className="value">{utc(run.hold.at)}</span>: {run.hold.reason}
                </dd>
              </>
            )}
          </dl>
        </div>
      </section>

      <section>
        <h2 className="mb-2 text-lg font-semibold">Readings</h2>
        <div className="overflow-x-auto rounded-lg border border-rule bg-card">
          <table className="w-full text-left text-sm">
            <thead className="border-b border-rule bg-paper-deep">
              <tr>
                <th className="px-3 py-2">Reading</th>
                <th className="px-3 py-2">Expected band</th>
                <th className="px-3 py-2">Measured</th>
                <th className="px-3 py-2">Deviation</th>
                <th className="px-3 py-2">Mark</th>
                <th className="px-3 py-2">Recorded by</th>
              </tr>
            </thead>
            <tbody>
              {readings.map((s) => {
                const e = entries.get(s.id);
                const r = s.reading!;
                return (
                  <tr
                    key={s.id}
                    data-reading-row={s.id}
                    className={`border-b border-rule last:border-0 print:break-inside-avoid ${e?.within === false ? 'bg-out-wash' : ''}`}
                  >
                    <td className="px-3 py-2">
                      <span className="value text-graphite-soft">{s.position}.</span> {s.text}
                      <span className="block text-xs text-graphite-soft">{r.testPoint}</span>
                    </td>
                    <td className="value px-3 py-2">
                      {r.expected !== null ? formatQuantity(r.expected, r.unit, 4) : '—'}
                      <span className="block text-xs text-graphite-soft">{r.bandText ?? r.error}</span>
                    </td>
                    <td className="value px-3 py-2">
                      {e?.measured != null ? formatQuantity(e.measured, r.unit, 4) : '—'}
                      {e?.raw && <span className="block text-xs text-graphite-soft">as typed: {e.raw}</span>}
                    </td>
                    <td className="value px-3 py-2">
                      {e?.deviation != null
                        ? `${e.deviation >= 0 ? '+' : ''}${formatQuantity(e.deviation, r.unit, 3)}`
                        : '—'}
                      {e?.deviationPercent != null && (
                        <span className="block">{`${e.deviationPercent >= 0 ? '+' : ''}${formatNumber(e.deviationPercent, 2)} %`}</span>
                      )}
                    </td>
                    <td className="px-3 py-2">
                      {e?.measured != null ? (
                        <Mark within={e.within} />
                      ) : (
                        <span className="text-graphite-soft">not recorded</span>
                      )}
                    </td>
                    <td className="px-3 py-2" data-recorded-by>
                      {e ? (
                        <>
                          {e.enteredBy.displayName}
                          <span className="value block text-xs text-graphite-soft">{utc(e.enteredAt)}</span>
                        </>
                      ) : (
                        '—'
                      )}
                    </td>
                  </tr>
                );
              })}
            </tbody>
          </table>
        </div>
      </section>

      <section className="print:break-inside-avoid">
        <h2 className="mb-2 text-lg font-semibold">Measured against expected</h2>
        <DeviationPlot steps={run.steps} entries={run.entries} />
      </section>

      <section>
        <h2 className="mb-2 text-lg font-semibold">Check steps and hazard notes</h2>
        <ol className="flex flex-col gap-1 text-sm">
          {ticks.map((s) => {
            const e = entries.get(s.id);
            return (
              <li key={s.id} className="flex gap-2 print:break-inside-avoid">
                <span className={`value ${e?.done ? 'text-ok' : 'text-out'}`}>{e?.done ? '✓' : '✗'}</span>
                <span>
                  <span className="value text-graphite-soft">{s.position}.</span>{' '}
                  {s.kind === 'hazard' && <strong>Hazard note: </strong>}
                  {s.text}
                  {e?.done && (
                    <span className="text-graphite-soft">
                      {' '}
                      — {s.kind === 'hazard' ? 'acknowledged' : 'done'} by {e.enteredBy.displayName},{' '}
                      <span className="value">{utc(e.enteredAt)}</span>
                    </span>
                  )}
                  {e?.note && <span className="block italic">Note: {e.note}</span>}
                </span>
              </li>
            );
          })}
        </ol>
      </section>

      {corrected.length > 0 && (
        <section>
          <h2 className="mb-2 text-lg font-semibold">Corrections (originals kept)</h2>
          <ul className="flex flex-col gap-2 text-sm">
            {corrected.map((e) => (
              <li key={e.stepId}>
                <strong>{run.steps.find((s) => s.id === e.stepId)?.text}</strong>
                <ol className="ml-5 list-decimal">
                  {e.history.map((h) => (
                    <li key={h.version}>
                      <span className="value">{h.raw ?? (h.done ? 'ticked' : 'un-ticked')}</span> by{' '}
                      {h.enteredBy.displayName}, <span className="value">{utc(h.enteredAt)}</span>
                      {h.reason && <> — why: {h.reason}</>}
                    </li>
                  ))}
                </ol>
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

      <section className="rounded-lg border border-rule bg-card p-4 print:break-inside-avoid">
        <h2 className="font-semibold">Signature</h2>
        {run.signature ? (
          <dl className="mt-2 grid grid-cols-[auto_1fr] gap-x-3 gap-y-1 text-sm">
            <dt className="text-graphite-soft">Signed by</dt>
            <dd>
              {run.signature.signer.displayName} ({run.signature.signerRole})
            </dd>
            <dt className="text-graphite-soft">Meaning</dt>
            <dd>performed: carried out this bench run and recorded these readings</dd>
            <dt className="text-graphite-soft">Signed at</dt>
            <dd className="value">{utc(run.signature.signedAt)}</dd>
            <dt className="text-graphite-soft">Content SHA-256</dt>
            <dd className="value break-all text-xs">{run.signature.contentHash}</dd>
            <dt className="text-graphite-soft">Check</dt>
            <dd className={run.signature.verified ? 'text-ok' : 'font-semibold text-out'}>
              {run.signature.verified
                ? 'The stored run content matches the signed hash.'
                : 'The stored run content does NOT match the signed hash.'}
            </dd>
          </dl>
        ) : (
          <p className="mt-2 text-sm">Not signed yet.</p>
        )}
      </section>
    </div>
  );
}
