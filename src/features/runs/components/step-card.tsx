import { useId, useMemo, useState, type ReactNode } from 'react';
import { z } from 'zod';
import {
  entryBody,
  type EntryView,
  type RunInstrument,
  type RunPhotoView,
  type RunStep,
} from '@shared/schemas/runs';
import { INSTRUMENT_KINDS } from '@shared/schemas/registers';
import { useInstruments } from '@/features/registers/api/instruments';
import { formatNumber, formatQuantity } from '@shared/units';
import { useZodForm } from '@/lib/form';
import { dismissRefused, queueEntry, type PendingEntry } from '../lib/entry-queue';
import { liveCheck } from '../lib/live-check';
import { Mark } from './mark';
import { StepPhoto } from './step-photo';
import { signFor } from '@shared/safety-signs';
import { SignalWord } from '@/components/ui/safety-sign';

interface Props {
  runId: string;
  step: RunStep;
  entry: EntryView | undefined;
  pending: PendingEntry[];
  locked: boolean;
  photos: RunPhotoView[];
  /** The run's usual instrument, taking the reading unless another is chosen. */
  defaultInstrument?: RunInstrument | null;
}

const big = 'min-h-12 rounded-md border px-4 text-base font-semibold';

function Status({ entry, pending }: { entry: EntryView | undefined; pending: PendingEntry[] }) {
  const waiting = pending.filter((p) => !p.refused);
  const refused = pending.filter((p) => p.refused);
  return (
    <div className="flex flex-col gap-1 text-sm">
      {waiting.length > 0 && (
        <p data-pending="true" className="rounded border border-pending bg-pending-wash px-2 py-1">
          Pending: saved on this tablet, sent when the server is reachable.
        </p>
      )}
      {waiting
        .filter((p) => p.waiting)
        .map((p) => (
          <p key={p.body.key} role="alert" className="font-semibold text-out">
            {p.waiting}
          </p>
        ))}
      {refused.map((p) => (
        <p key={p.body.key} role="alert" className="flex flex-wrap items-center gap-2 text-out">
          Not recorded: {p.refused}
          <button
            type="button"
            className="min-h-10 rounded border border-out px-2"
            onClick={() => dismissRefused(p.body.key)}
          >
            Dismiss
          </button>
        </p>
      ))}
      {entry && (
        <p data-saved="true" className="text-graphite-soft">
          Saved by {entry.enteredBy.displayName} at {new Date(entry.enteredAt).toLocaleTimeString()}
          {entry.version > 1 && ` (changed ${entry.version - 1}×; the original is kept)`}
          {entry.takenOn && `, from a paper sheet dated ${entry.takenOn}`}
        </p>
      )}
    </div>
  );
}

/** A typed value that changes the recorded measurement (and so needs a reason). */
const changes = (step: RunStep, recorded: number | null, text: string) => {
  const live = liveCheck(step, text);
  return (
    recorded !== null && (live.state === 'checked' || live.state === 'no-band') && live.measured !== recorded
  );
};

/** A reading entry before it is queued: read as the server reads it, within the server's limits. */
const readingForm = (step: RunStep, recorded: number | null) =>
  z
    .object({
      value: z
        .string()
        .superRefine((text, ctx) => {
          const live = liveCheck(step, text);
          if (live.state === 'empty') ctx.addIssue({ code: 'custom', message: 'Type the reading first' });
          if (live.state === 'error') ctx.addIssue({ code: 'custom', message: live.message });
        })
        .pipe(entryBody.shape.value.unwrap().options[0])
        .meta({ title: 'Measured value' }),
      note: z.string().pipe(entryBody.shape.note.unwrap()),
      reason: z.string().pipe(entryBody.shape.reason.unwrap()),
      instrumentId: z.string(),
    })
    .superRefine((v, ctx) => {
      if (changes(step, recorded, v.value) && !v.reason)
        ctx.addIssue({
          code: 'custom',
          path: ['reason'],
          message: 'Say why the recorded reading is being changed',
        });
    });

/** Which instrument takes the reading: the run's usual one, or another; one past its due date shows why it cannot. */
function InstrumentChoice({
  step,
  usual,
  taken,
  register,
}: {
  step: RunStep;
  usual: RunInstrument | null | undefined;
  taken: RunInstrument | null | undefined;
  register: ReturnType<ReturnType<typeof useZodForm>['register']>;
}) {
  const instruments = useInstruments();
  const list = instruments.data?.instruments ?? [];
  if (!usual && !taken && list.length === 0) return null;
  return (
    <label className="flex flex-col gap-1 text-sm font-semibold">
      Instrument
      <select
        aria-label={`Instrument: ${step.text}`}
        className="min-h-12 rounded-md border border-rule bg-card px-3 text-base font-normal"
        {...register}
      >
        <option value="">
          {taken
            ? `As recorded: ${taken.identifier}`
            : usual
              ? `The run’s usual: ${usual.identifier}`
              : 'None recorded'}
        </option>
        {list.map((i) => (
          <option key={i.id} value={i.id} disabled={!!i.refusal}>
            {i.identifier} · {INSTRUMENT_KINDS[i.kind]} · due {i.calibrationDue}
            {i.refusal ? ' — cannot be chosen: past its calibration due date' : ''}
          </option>
        ))}
      </select>
    </label>
  );
}

function ReadingStep({ runId, step, entry, pending, defaultInstrument }: Props) {
  const r = step.reading!;
  const last = [...pending].reverse().find((p) => !p.refused && p.body.value !== undefined);
  const recorded = entry?.measured ?? null;
  const schema = useMemo(() => readingForm(step, recorded), [step, recorded]);
  const form = useZodForm(schema, { defaultValues: { value: '', note: '', reason: '', instrumentId: '' } });
  const { errors } = form.formState;
  const text = form.watch('value');
  const live = liveCheck(step, text);
  const changing = changes(step, recorded, text);
  const submit = form.handleSubmit(({ value, note, reason, instrumentId }) => {
    queueEntry(runId, step.id, {
      value,
      ...(instrumentId ? { instrumentId } : {}),
      ...(note.trim() ? { note: note.trim() } : {}),
      ...(changing && reason ? { reason } : {}),
    });
    form.reset();
  });
  return (
    <form onSubmit={submit} className="flex flex-col gap-3" noValidate>
      <dl className="grid grid-cols-1 gap-x-6 gap-y-1 text-sm sm:grid-cols-3">
        <div>
          <dt className="text-graphite-soft">Test point</dt>
          <dd>{r.testPoint || '—'}</dd>
        </div>
        <div>
          <dt className="text-graphite-soft">Meter range</dt>
          <dd>{r.meterRange || '—'}</dd>
        </div>
        <div>
          <dt className="text-graphite-soft">Expected</dt>
          <dd data-band={r.low !== null ? `${r.low}:${r.high}` : ''}>
            {r.expected !== null ? (
              <>
                <span className="value font-semibold">{formatQuantity(r.expected, r.unit, 4)}</span>{' '}
                <span className="value text-graphite-soft">
                  ({r.bandText}, {r.toleranceText})
                </span>
              </>
            ) : (
              <span className="text-out">{r.error ?? 'no expected value'}</span>
            )}
          </dd>
        </div>
      </dl>
      {(recorded !== null || last) && (
        <p className="flex flex-wrap items-center gap-2">
          <span className="text-sm text-graphite-soft">Recorded:</span>
          {last ? (
            <>
              <span className="value text-lg">{String(last.body.value)}</span>
              <Mark
                within={(() => {
                  const c = liveCheck(step, String(last.body.value));
                  return c.state === 'checked' ? c.within : null;
                })()}
                pending
              />
            </>
          ) : (
            <>
              <span className="value text-lg">{formatQuantity(recorded!, r.unit, 4)}</span>
              <Mark within={entry!.within} />
              {entry!.deviation !== null && (
                <span className="value text-sm text-graphite-soft">
                  {entry!.deviation >= 0 ? '+' : ''}
                  {formatQuantity(entry!.deviation, r.unit, 3)}
                  {entry!.deviationPercent !== null &&
                    ` (${entry!.deviationPercent >= 0 ? '+' : ''}${formatNumber(entry!.deviationPercent, 2)} %)`}
                </span>
              )}
            </>
          )}
        </p>
      )}
      <div className="flex flex-wrap items-end gap-3">
        <label className="flex flex-col gap-1 text-sm font-semibold">
          {recorded !== null ? 'Correct the reading' : 'Measured'} ({r.unit})
          <input
            aria-label={`Measured: ${step.text}`}
            inputMode="decimal"
            autoComplete="off"
            spellCheck={false}
            {...form.register('value')}
            placeholder={r.expected !== null ? formatQuantity(r.expected, r.unit, 3) : `value in ${r.unit}`}
            aria-invalid={live.state === 'error' || !!errors.value || undefined}
            className={`value min-h-12 w-48 rounded-md border bg-card px-3 text-xl ${live.state === 'error' || errors.value ? 'border-out' : 'border-rule'}`}
          />
        </label>
        <div aria-live="polite" className="min-h-12 py-2">
          {live.state === 'checked' && (
            <span className="flex flex-wrap items-center gap-2">
              <Mark within={live.within} />
              <span className="value text-sm">
                {live.deviation >= 0 ? '+' : ''}
                {formatQuantity(live.deviation, r.unit, 3)}
                {live.deviationPercent !== null &&
                  ` (${live.deviationPercent >= 0 ? '+' : ''}${formatNumber(live.deviationPercent, 2)} %)`}
              </span>
            </span>
          )}
          {live.state === 'no-band' && <Mark within={null} />}
          {/* The reading's problem as it is typed; an empty value is only refused when recorded. */}
          {(live.state === 'error' || errors.value) && (
            <span className="text-sm text-out">
              {live.state === 'error' ? live.message : errors.value?.message}
            </span>
          )}
        </div>
      </div>
      <InstrumentChoice
        step={step}
        usual={defaultInstrument}
        taken={entry?.instrument}
        register={form.register('instrumentId')}
      />
      {changing && (
        <label className="flex flex-col gap-1 text-sm font-semibold">
          Why is the recorded reading being changed? (kept with the original)
          <input
            {...form.register('reason')}
            aria-invalid={errors.reason ? true : undefined}
            className="min-h-12 rounded-md border border-rule bg-card px-3 text-base font-normal"
          />
          {errors.reason && (
            <span role="alert" className="font-normal text-out">
              {errors.reason.message}
            </span>
          )}
        </label>
      )}
      <label className="flex flex-col gap-1 text-sm font-semibold">
        Note (optional)
        <input
          {...form.register('note')}
          placeholder={entry?.note || ''}
          className="min-h-12 rounded-md border border-rule bg-card px-3 text-base font-normal"
        />
        {errors.note && (
          <span role="alert" className="font-normal text-out">
            {errors.note.message}
          </span>
        )}
      </label>
      <button
        type="submit"
        className={`${big} self-start border-accent-deep bg-accent text-white disabled:opacity-50`}
      >
        {recorded !== null ? 'Record correction' : 'Record reading'}
      </button>
    </form>
  );
}

function TickStep({ runId, step, entry, pending }: Props) {
  const last = [...pending].reverse().find((p) => !p.refused && p.body.done !== undefined);
  const done = last ? !!last.body.done : !!entry?.done;
  const [note, setNote] = useState('');
  const [reason, setReason] = useState('');
  const [unticking, setUnticking] = useState(false);
  const hazard = step.kind === 'hazard';
  const whyId = useId();
  const needsReason = !hazard && done && unticking && !reason.trim();
  const inert = (hazard && done) || needsReason;
  const why =
    hazard && done
      ? 'Acknowledged: an acknowledgement cannot be taken back.'
      : needsReason
        ? 'Type the reason above to un-tick this step.'
        : '';
  const toggle = () => {
    if (hazard && done) return;
    if (done && !unticking) return setUnticking(true);
    if (done && !reason.trim()) return;
    setUnticking(false);
    queueEntry(runId, step.id, {
      done: !done,
      ...(note.trim() ? { note: note.trim() } : {}),
      ...(done ? { reason: reason.trim() } : {}),
    });
    setNote('');
    setReason('');
  };
  return (
    <div className="flex flex-col gap-3">
      <p className={hazard ? 'whitespace-pre-line text-base font-semibold' : 'text-base'}>{step.text}</p>
      {!hazard && (
        <label className="flex flex-col gap-1 text-sm font-semibold">
          Note (optional)
          <input
            value={note}
            onChange={(e) => setNote(e.target.value)}
            placeholder={entry?.note || ''}
            className="min-h-12 rounded-md border border-rule bg-card px-3 text-base font-normal"
          />
        </label>
      )}
      {done && !hazard && unticking && (
        <label className="flex flex-col gap-1 text-sm font-semibold">
          Reason, if you are un-ticking it
          <input
            value={reason}
            onChange={(e) => setReason(e.target.value)}
            className="min-h-12 rounded-md border border-rule bg-card px-3 text-base font-normal"
          />
        </label>
      )}
      {/* aria-disabled, not disabled: a disabled button drops the keyboard focus to the page's top. */}
      <button
        type="button"
        aria-pressed={done}
        onClick={toggle}
        aria-disabled={inert || undefined}
        aria-describedby={why ? `${whyId}` : undefined}
        className={`${big} self-start ${done ? 'border-ok bg-ok text-white' : hazard ? 'border-graphite bg-card text-graphite' : 'border-accent-deep bg-card text-accent-deep'} aria-disabled:cursor-not-allowed aria-disabled:opacity-90`}
      >
        {hazard
          ? done
            ? '✓ Hazard note acknowledged'
            : 'I have read this hazard note'
          : done
            ? unticking
              ? 'Un-tick with this reason'
              : '✓ Done (tap to un-tick)'
            : 'Mark as done'}
      </button>
      {why && (
        <p id={whyId} className="text-sm text-graphite-soft">
          {why}
        </p>
      )}
    </div>
  );
}

/** One step of the bench checklist: a reading, a check step or a hazard note. */
export function StepCard(props: Props & { children?: ReactNode }) {
  const { step, locked, entry, pending, runId, photos } = props;
  const hazard = step.kind === 'hazard';
  const sign = hazard ? signFor(step.hazard?.level ?? 'danger') : null;
  const kindLabel = sign
    ? `Hazard note: ${sign.word.toLowerCase()}`
    : step.kind === 'reading'
      ? step.live
        ? 'Reading (live)'
        : 'Reading'
      : (step.check?.heading ?? 'Check step');
  return (
    <article
      data-step-id={step.id}
      data-step-kind={step.kind}
      aria-labelledby={`step-${step.id}-title`}
      className={`flex flex-col gap-3 rounded-lg p-4 ${hazard ? 'border-4 bg-card' : locked ? 'border-2 border-dashed border-rule bg-paper' : 'border-2 border-rule bg-card'}`}
      style={sign ? { borderColor: sign.field } : undefined}
    >
      {hazard && <SignalWord level={step.hazard?.level ?? 'danger'} />}
      <header className="flex flex-wrap items-baseline gap-x-3">
        <span className="value text-sm text-graphite-soft">Step {step.position}</span>
        <span className="text-xs font-semibold uppercase tracking-wide text-graphite-soft">{kindLabel}</span>
        {step.section && <span className="text-xs text-graphite-soft">· {step.section}</span>}
        {step.holdPoint && (
          <span
            data-hold-point-marker
            title="Out of band here, the run stops until a reviewer or admin decides"
            className="rounded border-2 border-out px-2 text-xs font-bold uppercase tracking-wide text-out"
          >
            Hold point
          </span>
        )}
      </header>
      {hazard && !!step.hazard?.flags?.length && (
        <ul className="flex flex-wrap gap-1 text-sm font-semibold" aria-label="Live-work cautions">
          {step.hazard.flags.map((f) => (
            <li key={f} className="rounded border-2 border-graphite px-2 py-0.5">
              {f}
            </li>
          ))}
        </ul>
      )}
      {step.kind === 'reading' && (
        <h3 id={`step-${step.id}-title`} className="text-lg font-semibold">
          {step.text}
        </h3>
      )}
      {step.kind !== 'reading' && (
        <h3 id={`step-${step.id}-title`} className="sr-only">
          {kindLabel}
        </h3>
      )}
      {locked ? (
        <>
          {step.kind !== 'reading' && <p>{step.text}</p>}
          <p className="text-sm font-semibold">Acknowledge the hazard note above before this step.</p>
        </>
      ) : step.kind === 'reading' ? (
        <ReadingStep {...props} />
      ) : (
        <TickStep {...props} />
      )}
      <Status entry={entry} pending={pending} />
      {!hazard && !locked && <StepPhoto runId={runId} stepId={step.id} photos={photos} />}
      {props.children}
    </article>
  );
}
