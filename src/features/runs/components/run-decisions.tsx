import { useId, useState } from 'react';
import { formatUtc } from '@shared/runs/run-sheet-model';
import {
  deviationDecisionBody,
  holdDecisionBody,
  SENIOR_WORDS,
  STEP_EXCEPTION_WORDS,
  stepExceptionBody,
  type RunHoldPointView,
  type RunStepExceptionView,
} from '@shared/schemas/run-decisions';
import type { RunStep, RunView } from '@shared/schemas/runs';
import { formatQuantity } from '@shared/units';
import { TextareaField } from '@/components/ui/field';
import { FormProblem } from '@/components/ui/form-problem';
import { showServerError, useZodForm } from '@/lib/form';
import { useDecideDeviation, useDecideHold, useRecordStepException } from '../api/run-decisions';

const band = (h: RunHoldPointView) =>
  h.low !== null && h.high !== null
    ? `${formatQuantity(h.low, h.unit, 4)} … ${formatQuantity(h.high, h.unit, 4)}`
    : 'no band';

const radio = 'flex min-h-12 items-center gap-2 rounded-md border border-rule bg-paper px-3';
const submitButton =
  'min-h-12 self-start rounded-md border border-accent-deep bg-accent px-5 text-base font-semibold text-white disabled:opacity-50';

/** The open holds on a run: what stopped it and who may decide; the decide panel for a senior. */
export function HoldPointBanner({ run, canDecide }: { run: RunView; canDecide: boolean }) {
  const open = (run.holdPoints ?? []).filter((h) => h.decision === null);
  if (run.status !== 'in_progress' || !open.length) return null;
  return (
    <>
      {open.map((h) => (
        <div
          key={h.id}
          data-hold-point-banner
          role="alert"
          className="flex flex-col gap-2 rounded-md border-2 border-out bg-out-wash px-4 py-3 text-out"
        >
          <p className="font-semibold">
            Stopped at a hold point: step {h.position}, {h.text}, measured{' '}
            <span className="value">{h.raw}</span>, expected <span className="value">{band(h)}</span>.
          </p>
          <p className="text-sm text-graphite">
            Nothing more can be recorded or signed on this run until {SENIOR_WORDS} decides to continue (with
            a reason) or to abandon it. Recorded by {h.openedBy.displayName},{' '}
            <span className="value">{formatUtc(h.openedAt)}</span>.
          </p>
          {canDecide && <DecideHold runId={run.id} hold={h} />}
        </div>
      ))}
    </>
  );
}

function DecideHold({ runId, hold }: { runId: string; hold: RunHoldPointView }) {
  const decide = useDecideHold(runId);
  const form = useZodForm(holdDecisionBody, { defaultValues: { decision: 'continue', reason: '' } });
  const submit = form.handleSubmit((body) =>
    decide.mutate({ ...body, holdId: hold.id }, { onError: (e) => showServerError(form, e) }),
  );
  const errors = form.formState.errors;
  return (
    <form
      onSubmit={submit}
      aria-label="Decide the hold point"
      className="flex flex-col gap-2 rounded-md bg-card p-3 text-graphite"
      noValidate
    >
      <h2 className="font-semibold">Decide</h2>
      <FormProblem formState={form.formState} />
      <fieldset className="flex flex-wrap gap-2">
        <legend className="sr-only">Decision</legend>
        <label className={radio}>
          <input type="radio" value="continue" className="size-5" {...form.register('decision')} /> Continue
          the run
        </label>
        <label className={radio}>
          <input type="radio" value="abandon" className="size-5" {...form.register('decision')} /> Abandon the
          run
        </label>
      </fieldset>
      <TextareaField
        label="Reason for the decision"
        {...form.register('reason')}
        error={errors.reason?.message}
      />
      <button type="submit" disabled={decide.isPending} className={submitButton}>
        {decide.isPending ? 'Recording…' : 'Record the decision'}
      </button>
    </form>
  );
}

/** Deviations waiting on a run, each with approve / refuse and a note, for a senior. */
export function DeviationDecisions({ run }: { run: RunView }) {
  const waiting = (run.exceptions ?? []).filter((x) => x.kind === 'deviation' && x.decision === null);
  if (run.status !== 'in_progress' || !waiting.length) return null;
  return (
    <section
      data-deviations-waiting
      aria-label="Deviations to decide"
      className="flex flex-col gap-3 rounded-lg border-2 border-pending bg-pending-wash p-4"
    >
      <h2 className="text-lg font-semibold">Deviations to decide</h2>
      {waiting.map((x) => (
        <DecideDeviation key={x.id} runId={run.id} deviation={x} />
      ))}
    </section>
  );
}

function DecideDeviation({ runId, deviation }: { runId: string; deviation: RunStepExceptionView }) {
  const decide = useDecideDeviation(runId);
  const form = useZodForm(deviationDecisionBody, { defaultValues: { decision: 'approved', note: '' } });
  const submit = form.handleSubmit((body) =>
    decide.mutate({ ...body, exceptionId: deviation.id }, { onError: (e) => showServerError(form, e) }),
  );
  return (
    <form
      onSubmit={submit}
      aria-label={`Decide the deviation on step ${deviation.position}`}
      className="flex flex-col gap-2 rounded-md bg-card p-3"
      noValidate
    >
      <p>
        <strong>
          Step {deviation.position}: {deviation.text}
        </strong>
      </p>
      <p className="text-sm">
        Done instead: {deviation.reason} ({deviation.recordedBy.displayName},{' '}
        <span className="value">{formatUtc(deviation.recordedAt)}</span>)
      </p>
      <FormProblem formState={form.formState} />
      <fieldset className="flex flex-wrap gap-2">
        <legend className="sr-only">Decision</legend>
        <label className={radio}>
          <input type="radio" value="approved" className="size-5" {...form.register('decision')} /> Approve
        </label>
        <label className={radio}>
          <input type="radio" value="refused" className="size-5" {...form.register('decision')} /> Refuse
        </label>
      </fieldset>
      <TextareaField
        label="Note on the decision"
        {...form.register('note')}
        error={form.formState.errors.note?.message}
      />
      <button type="submit" disabled={decide.isPending} className={submitButton}>
        {decide.isPending ? 'Recording…' : 'Record the decision'}
      </button>
    </form>
  );
}

const recordWords = (x: RunStepExceptionView) =>
  x.kind === 'not_applicable'
    ? 'counts as done'
    : x.decision === 'approved'
      ? `approved by ${x.decidedBy?.displayName}: ${x.decisionNote}`
      : x.decision === 'refused'
        ? `refused by ${x.decidedBy?.displayName}: ${x.decisionNote}. Do the step as written, or record it again.`
        : `waiting for ${SENIOR_WORDS} to approve it`;

/** On a bench step: its current record, and the form to record it as not applicable or a deviation. */
export function StepRecord({
  runId,
  step,
  records,
}: {
  runId: string;
  step: RunStep;
  records: RunStepExceptionView[];
}) {
  const current = records.find((x) => x.current);
  const [open, setOpen] = useState(false);
  const id = useId();
  const record = useRecordStepException(runId);
  const form = useZodForm(stepExceptionBody, {
    defaultValues: { stepId: step.id, kind: 'not_applicable', reason: '' },
  });
  const kind = form.watch('kind');
  const submit = form.handleSubmit((body) =>
    record.mutate(body, {
      onError: (e) => showServerError(form, e),
      onSuccess: () => {
        setOpen(false);
        form.reset({ stepId: step.id, kind: 'not_applicable', reason: '' });
      },
    }),
  );
  const waiting = current?.kind === 'deviation' && current.decision === null;
  return (
    <div className="flex flex-col gap-2 text-sm">
      {current && (
        <p
          data-step-record={current.kind}
          className={`rounded-md border px-3 py-2 ${current.kind === 'deviation' && current.decision !== 'approved' ? 'border-pending bg-pending-wash' : 'border-rule bg-paper'}`}
        >
          <strong>{STEP_EXCEPTION_WORDS[current.kind]}:</strong> {current.reason} — {recordWords(current)}
        </p>
      )}
      {!waiting && (
        <button
          type="button"
          aria-expanded={open}
          aria-controls={id}
          onClick={() => setOpen(!open)}
          className="min-h-11 self-start rounded-md border border-rule bg-card px-3 font-semibold"
        >
          Not applicable, or done another way…
        </button>
      )}
      {open && (
        <form
          id={id}
          onSubmit={submit}
          aria-label={`Record step ${step.position} as not applicable or a deviation`}
          className="flex flex-col gap-2"
          noValidate
        >
          <FormProblem formState={form.formState} />
          <fieldset className="flex flex-wrap gap-2">
            <legend className="sr-only">Kind of record</legend>
            <label className={radio}>
              <input type="radio" value="not_applicable" className="size-5" {...form.register('kind')} /> Not
              applicable
            </label>
            <label className={radio}>
              <input type="radio" value="deviation" className="size-5" {...form.register('kind')} /> Done
              another way (deviation)
            </label>
          </fieldset>
          <TextareaField
            label={kind === 'deviation' ? 'What was done instead, and why' : 'Why it does not apply'}
            hint={
              kind === 'deviation'
                ? `A deviation needs the approval of ${SENIOR_WORDS} before the run can be signed.`
                : undefined
            }
            {...form.register('reason')}
            error={form.formState.errors.reason?.message}
          />
          <button type="submit" disabled={record.isPending} className={submitButton}>
            {record.isPending ? 'Recording…' : 'Record'}
          </button>
        </form>
      )}
    </div>
  );
}
