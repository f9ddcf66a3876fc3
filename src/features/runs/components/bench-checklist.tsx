import { useId, useMemo, useState } from 'react';
import { WhyDisabled } from '@/components/ui/button';
import { MARK_WORDS } from '@shared/runs/run-sheet-model';
import type { RunStep, RunView } from '@shared/schemas/runs';
import { formatQuantity } from '@shared/units';
import type { PendingEntry } from '../lib/entry-queue';
import { SignRunForm } from './sign-run-form';
import { StepCard } from './step-card';
import { StepRecord } from './run-decisions';

type Mode = 'one' | 'all';
const MODE_KEY = 'benchwright.checklist-mode';

/** What the bench sees: server entries with this tablet's pending ones laid over them. */
function effectiveState(run: RunView, pending: PendingEntry[]) {
  const state = new Map<string, { done: boolean; measured: boolean }>();
  for (const e of run.entries) state.set(e.stepId, { done: e.done, measured: e.measured !== null });
  for (const p of pending.filter((x) => !x.refused)) {
    const cur = state.get(p.stepId) ?? { done: false, measured: false };
    state.set(p.stepId, {
      done: p.body.done ?? cur.done,
      measured: cur.measured || p.body.value !== undefined,
    });
  }
  // Not applicable, or a deviation a senior approved, finishes a step too.
  const excused = new Set(
    (run.exceptions ?? [])
      .filter((x) => x.current && (x.kind === 'not_applicable' || x.decision === 'approved'))
      .map((x) => x.stepId),
  );
  const finished = (s: RunStep) =>
    excused.has(s.id) || (s.kind === 'reading' ? !!state.get(s.id)?.measured : !!state.get(s.id)?.done);
  const gate = run.steps.find((s) => s.kind === 'hazard' && !state.get(s.id)?.done);
  const locked = new Set(gate ? run.steps.filter((s) => s.position > gate.position).map((s) => s.id) : []);
  return { finished, locked, done: run.steps.filter(finished).length };
}

export function BenchChecklist({
  run,
  pending,
  onSigned,
}: {
  run: RunView;
  pending: PendingEntry[];
  onSigned: () => void;
}) {
  const [mode, setModeState] = useState<Mode>(() =>
    localStorage.getItem(MODE_KEY) === 'one' ? 'one' : 'all',
  );
  const setMode = (m: Mode) => {
    localStorage.setItem(MODE_KEY, m);
    setModeState(m);
  };
  const { finished, locked, done } = useMemo(() => effectiveState(run, pending), [run, pending]);
  const firstOpen = run.steps.findIndex((s) => !finished(s));
  const [index, setIndex] = useState(() => Math.max(0, firstOpen));
  const whyId = useId();
  const entries = new Map(run.entries.map((e) => [e.stepId, e]));
  const waiting = pending.filter((p) => !p.refused).length;
  const total = run.steps.length;
  const visible = mode === 'all' ? run.steps : run.steps.slice(index, index + 1);
  const card = (s: RunStep) => (
    <StepCard
      key={s.id}
      runId={run.id}
      step={s}
      entry={entries.get(s.id)}
      pending={pending.filter((p) => p.stepId === s.id)}
      locked={locked.has(s.id)}
      photos={run.photos.filter((p) => p.stepId === s.id)}
      defaultInstrument={run.defaultInstrument}
    >
      {s.kind !== 'hazard' && !locked.has(s.id) && (
        <StepRecord
          runId={run.id}
          step={s}
          records={(run.exceptions ?? []).filter((x) => x.stepId === s.id)}
        />
      )}
    </StepCard>
  );
  return (
    <div className="flex flex-col gap-4">
      <div className="sticky top-0 z-10 flex flex-col gap-2 border-b border-rule bg-paper/95 py-3 backdrop-blur">
        <div className="flex flex-wrap items-center gap-3">
          <p data-progress className="text-lg font-semibold">
            {done} of {total} steps
          </p>
          <div className="h-3 min-w-32 flex-1 overflow-hidden rounded bg-paper-deep" aria-hidden>
            <div className="h-full bg-accent" style={{ width: `${total ? (done / total) * 100 : 0}%` }} />
          </div>
          {run.progress.outOfTolerance > 0 && (
            <span className="font-semibold text-out">
              {run.progress.outOfTolerance} {MARK_WORDS.out}
            </span>
          )}
          {waiting > 0 && (
            <span
              data-pending-count={waiting}
              className="rounded border border-pending bg-pending-wash px-2 py-1 text-sm font-semibold text-pending"
            >
              {waiting} waiting to be sent
            </span>
          )}
        </div>
        <div className="flex flex-wrap items-center gap-2 text-sm">
          <span className="text-graphite-soft">
            Mains at the bench{' '}
            <span className="value">{formatQuantity(run.params.mainsVoltage, 'V', 4)}</span>,{' '}
            <span className="value">{formatQuantity(run.params.mainsFrequency, 'Hz', 3)}</span>
          </span>
          <div role="group" aria-label="Checklist mode" className="ml-auto flex gap-1">
            {(['one', 'all'] as const).map((m) => (
              <button
                key={m}
                type="button"
                aria-pressed={mode === m}
                onClick={() => setMode(m)}
                className={`min-h-12 rounded-md border px-4 font-semibold ${mode === m ? 'border-accent-deep bg-accent text-white' : 'border-rule bg-card'}`}
              >
                {m === 'one' ? 'One step at a time' : 'Whole list'}
              </button>
            ))}
          </div>
        </div>
      </div>
      {visible.map(card)}
      {mode === 'one' && (
        <div className="flex gap-3">
          {/* aria-disabled, not disabled: reaching the last step keeps the keyboard focus on the button. */}
          <button
            type="button"
            aria-disabled={index === 0 || undefined}
            aria-describedby={index === 0 ? `${whyId}-first` : undefined}
            onClick={() => index > 0 && setIndex(index - 1)}
            className="min-h-14 flex-1 rounded-md border border-rule bg-card text-lg font-semibold aria-disabled:cursor-not-allowed aria-disabled:opacity-40"
          >
            ← Previous
          </button>
          <button
            type="button"
            aria-disabled={index >= total - 1 || undefined}
            aria-describedby={index >= total - 1 ? `${whyId}-last` : undefined}
            onClick={() => index < total - 1 && setIndex(index + 1)}
            className="min-h-14 flex-1 rounded-md border border-accent-deep bg-accent text-lg font-semibold text-white aria-disabled:cursor-not-allowed aria-disabled:opacity-40"
          >
            Next step →
          </button>
        </div>
      )}
      {mode === 'one' && (
        <p className="text-sm text-graphite-soft">
          <WhyDisabled id={`${whyId}-first`} why={index === 0 && 'This is the first step.'} />
          <WhyDisabled id={`${whyId}-last`} why={index >= total - 1 && 'This is the last step.'} />
        </p>
      )}
      {/* The signing panel comes only when there is something to sign: every step done and saved. */}
      {run.witness && !run.witness.signature?.current && (
        <p data-witness-waiting className="rounded-md border border-rule bg-card px-4 py-3 text-sm">
          {run.witness.person.displayName} witnesses this run: they co-sign it as witnessed once every step is
          done{run.witness.signature ? ' (again: an entry changed after they signed)' : ''}, and you sign
          after them.
        </p>
      )}
      {done === total && waiting === 0 ? (
        <SignRunForm runId={run.id} ready onSigned={onSigned} />
      ) : (
        <p data-sign-waiting className="rounded-md border border-dashed border-rule px-4 py-3 text-sm">
          The run sheet can be signed once every step is done
          {waiting > 0
            ? ` and ${waiting} queued ${waiting === 1 ? 'entry reaches' : 'entries reach'} the server`
            : ''}{' '}
          ({total - done} of {total} steps left).
        </p>
      )}
    </div>
  );
}
