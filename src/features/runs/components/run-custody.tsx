import { Link } from 'react-router-dom';
import { formatUtc } from '@shared/runs/run-sheet-model';
import {
  abandonBody,
  handoverBody,
  type RunHold,
  type RunStep,
  type RunSupersession,
  type RunView,
} from '@shared/schemas/runs';
import { paths } from '@/config/paths';
import { Field, SelectField } from '@/components/ui/field';
import { FormProblem } from '@/components/ui/form-problem';
import { labelOf, showServerError, useZodForm } from '@/lib/form';
import { useAbandon, useHandOver, useTechnicians } from '../api/run-custody';
import type { PendingEntry } from '../lib/entry-queue';

/** The revision this run follows was withdrawn: said at the top of the bench and of the sheet. */
export function HoldBanner({ hold }: { hold: RunHold }) {
  return (
    <div data-hold role="alert" className="rounded-md border-2 border-out bg-out-wash px-4 py-3 text-out">
      <p className="font-semibold">
        On hold: revision {hold.revisionNumber} was withdrawn by {hold.by},{' '}
        <span className="value">{formatUtc(hold.at)}</span>.
      </p>
      <p>Reason: {hold.reason}</p>
      <p className="text-sm">
        Nothing more can be recorded or signed on this run. Close it as abandoned, and start again when a new
        revision is approved.
      </p>
    </div>
  );
}

/** An open run on a revision a newer approved one replaced: it may go on; what changed, and where the new one is. */
export function SupersededBanner({
  superseded,
  ownRevision,
  technician,
}: {
  superseded: RunSupersession;
  ownRevision: number;
  /** The acknowledgement page (what changed, as a diff) is a technician's. */
  technician: boolean;
}) {
  return (
    <div
      data-superseded
      role="status"
      className="rounded-md border-2 border-pending bg-pending-wash px-4 py-3 text-sm"
    >
      <p className="font-semibold text-pending">
        Revision {superseded.number} replaced revision {ownRevision}, which this run follows.
      </p>
      <p>This run may go on as started; its run sheet records revision {ownRevision}. What changed since:</p>
      <ul className="ml-5 list-disc">
        {superseded.changes.map((c) => (
          <li key={c.revisionId}>
            Revision {c.number}: {c.changeReason || 'no reason recorded'}
          </li>
        ))}
      </ul>
      <p className="mt-1 flex flex-wrap gap-x-4">
        <Link
          to={paths.revision.href(superseded.revisionId)}
          className="font-semibold text-accent-deep underline"
        >
          Open revision {superseded.number}
        </Link>
        {technician && (
          <Link
            to={paths.acknowledgeRevision.href(superseded.revisionId)}
            className="font-semibold text-accent-deep underline"
          >
            Read what changed
          </Link>
        )}
      </p>
    </div>
  );
}

/** Entries someone else made on this tablet: they wait for that person, and are never sent as anyone else. */
export function WaitingEntries({
  items,
  steps,
}: {
  items: (PendingEntry & { waiting: string })[];
  steps: RunStep[];
}) {
  if (!items.length) return null;
  return (
    <div
      role="alert"
      data-waiting-count={items.length}
      className="rounded-md border-2 border-pending bg-pending-wash px-4 py-3 text-sm"
    >
      <p className="font-semibold">
        {items.length} {items.length === 1 ? 'entry is' : 'entries are'} waiting on this tablet, not sent:
      </p>
      <ul className="mt-1 list-disc pl-5">
        {items.map((p) => (
          <li key={p.body.key}>
            Step {steps.find((s) => s.id === p.stepId)?.position ?? '?'}: {p.waiting}
          </li>
        ))}
      </ul>
    </div>
  );
}

const input = 'min-h-12 bg-paper';
const button = 'min-h-12 self-start rounded-md border px-5 text-base font-semibold disabled:opacity-50';

function HandoverForm({ run }: { run: RunView }) {
  const technicians = useTechnicians(true);
  const handOver = useHandOver(run.id);
  const form = useZodForm(handoverBody, { defaultValues: { to: '', reason: '' } });
  const { errors } = form.formState;
  const submit = form.handleSubmit((body) =>
    handOver.mutate(body, {
      onSuccess: () => form.resetField('reason'),
      onError: (e) => showServerError(form, e),
    }),
  );
  const others = technicians.data?.technicians.filter((t) => t.id !== run.performedBy.id) ?? [];
  return (
    <form aria-label="Hand over this run" onSubmit={submit} className="flex flex-col gap-2" noValidate>
      <h3 className="font-semibold">Hand over to another technician</h3>
      <p className="text-sm text-graphite-soft">
        They record the remaining steps and sign; the run sheet names you both and who recorded what.
      </p>
      <SelectField
        label={labelOf(handoverBody, 'to')}
        className={input}
        {...form.register('to')}
        error={errors.to?.message}
      >
        <option value="">Choose…</option>
        {others.map((t) => (
          <option key={t.id} value={t.id}>
            {t.displayName}
          </option>
        ))}
      </SelectField>
      <Field
        label={labelOf(handoverBody, 'reason')}
        maxLength={500}
        className={input}
        {...form.register('reason')}
        error={errors.reason?.message}
      />
      <FormProblem formState={form.formState} />
      <button
        type="submit"
        disabled={handOver.isPending}
        className={`${button} border-accent-deep bg-accent text-white`}
      >
        {handOver.isPending ? 'Handing over…' : 'Hand over the run'}
      </button>
    </form>
  );
}

function AbandonForm({ run }: { run: RunView }) {
  const abandon = useAbandon(run.id);
  const form = useZodForm(abandonBody, { defaultValues: { reason: '' } });
  const submit = form.handleSubmit((body) =>
    abandon.mutate(body, { onError: (e) => showServerError(form, e) }),
  );
  return (
    <form
      aria-label="Close this run as abandoned"
      onSubmit={submit}
      className="flex flex-col gap-2"
      noValidate
    >
      <h3 className="font-semibold">Close as abandoned</h3>
      <p className="text-sm text-graphite-soft">
        The run is kept as it is, not signed; nothing on it can change afterwards.
      </p>
      <Field
        label={labelOf(abandonBody, 'reason')}
        maxLength={500}
        className={input}
        {...form.register('reason')}
        error={form.formState.errors.reason?.message}
      />
      <FormProblem formState={form.formState} />
      <button type="submit" disabled={abandon.isPending} className={`${button} border-out bg-card text-out`}>
        {abandon.isPending ? 'Closing…' : 'Close as abandoned'}
      </button>
    </form>
  );
}

/** For the run's performer (or an admin): hand the run over, or close it as abandoned. */
export function RunCustody({ run }: { run: RunView }) {
  return (
    <section
      aria-label="Hand over or close"
      className="grid grid-cols-1 gap-6 rounded-lg border border-rule bg-card p-4 sm:grid-cols-2"
    >
      {!run.hold && <HandoverForm run={run} />}
      <AbandonForm run={run} />
    </section>
  );
}
