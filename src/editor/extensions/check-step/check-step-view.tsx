import { useId } from 'react';
import type { NodeViewProps } from '@tiptap/react';
import {
  checkKindOf,
  checkStepAttrs,
  type CheckKind,
  type CheckStepAttrs,
  type WaitDrain,
} from '@shared/document/schema';
import { BlockFrame } from '../block-frame';
import { DEFAULT_DISCHARGE_THRESHOLD } from './check-step';

const control = 'min-h-9 rounded border border-rule bg-card px-2 py-1 text-sm';

const KINDS: { value: CheckKind; label: string }[] = [
  { value: 'confirm', label: 'Confirmation' },
  { value: 'discharge-verified', label: 'Discharge verified with a meter' },
  { value: 'wait', label: 'Wait' },
];
const DRAINS: { value: WaitDrain; label: string }[] = [
  { value: 'bleeder', label: 'the bleeder (after switch-off)' },
  { value: 'probe', label: 'the discharge probe, per node' },
  { value: 'none', label: 'nothing: a wait to warm up or settle' },
];
/** A new wait step starts at a minute; the procedure check holds it against the bleeder's time. */
const DEFAULT_WAIT_S = 60;

/** A schema message as a sentence: "must be …" reads after the field's name, the others stand alone. */
const sentence = (subject: string, message: string) =>
  /^(must|is) /.test(message)
    ? `${subject} ${message}.`
    : `${message.charAt(0).toUpperCase()}${message.slice(1)}.`;

/** Attributes a kind does not take, cleared when the author switches to it. */
function switchTo(kind: CheckKind, attrs: CheckStepAttrs): Partial<Record<keyof CheckStepAttrs, unknown>> {
  return {
    kind: kind === 'confirm' ? null : kind,
    threshold: kind === 'discharge-verified' ? (attrs.threshold ?? DEFAULT_DISCHARGE_THRESHOLD) : null,
    seconds: kind === 'wait' ? (attrs.seconds ?? DEFAULT_WAIT_S) : null,
    drain: kind === 'wait' ? (attrs.drain ?? null) : null,
  };
}

export function CheckStepView({ node, updateAttributes, deleteNode, selected }: NodeViewProps) {
  const attrs = node.attrs as CheckStepAttrs;
  const kind = checkKindOf(attrs);
  const ids = {
    text: useId(),
    kind: useId(),
    threshold: useId(),
    seconds: useId(),
    drain: useId(),
    live: useId(),
  };
  // The same validation the server applies, so a bad threshold or duration is named here first.
  const parsed = checkStepAttrs.safeParse(attrs);
  const problem = (key: keyof CheckStepAttrs) =>
    parsed.success ? undefined : parsed.error.issues.find((i) => i.path[0] === key)?.message;
  const thresholdProblem = problem('threshold');
  const secondsProblem = problem('seconds');

  return (
    <BlockFrame blockId={attrs.id} selected={selected} onRemove={deleteNode} title="Check step">
      <div className="flex items-start gap-3">
        {/* What the technician will see: a box to tick. Not tickable while writing. */}
        <span aria-hidden className="mt-2 inline-block size-5 shrink-0 rounded border-2 border-graphite" />
        <div className="flex flex-1 flex-col gap-2">
          <div className="flex flex-wrap items-end gap-3">
            <div className="flex flex-col gap-1">
              <label htmlFor={ids.kind} className="text-xs font-semibold">
                Kind of step
              </label>
              <select
                id={ids.kind}
                className={control}
                value={kind}
                onChange={(e) => updateAttributes(switchTo(e.target.value as CheckKind, attrs))}
              >
                {KINDS.map((k) => (
                  <option key={k.value} value={k.value}>
                    {k.label}
                  </option>
                ))}
              </select>
            </div>
            {kind === 'discharge-verified' && (
              <div className="flex flex-col gap-1">
                <label htmlFor={ids.threshold} className="text-xs font-semibold">
                  Verified below
                </label>
                <input
                  id={ids.threshold}
                  className={`${control} value w-28`}
                  value={attrs.threshold ?? ''}
                  placeholder={DEFAULT_DISCHARGE_THRESHOLD}
                  aria-invalid={!!thresholdProblem}
                  aria-describedby={thresholdProblem ? `${ids.threshold}-problem` : undefined}
                  onChange={(e) => updateAttributes({ threshold: e.target.value })}
                />
              </div>
            )}
            {kind === 'wait' && (
              <>
                <div className="flex flex-col gap-1">
                  <label htmlFor={ids.seconds} className="text-xs font-semibold">
                    Wait (seconds)
                  </label>
                  <input
                    id={ids.seconds}
                    type="number"
                    min={1}
                    step="any"
                    inputMode="decimal"
                    className={`${control} value w-28`}
                    value={attrs.seconds ?? ''}
                    aria-invalid={!!secondsProblem}
                    aria-describedby={secondsProblem ? `${ids.seconds}-problem` : undefined}
                    onChange={(e) =>
                      updateAttributes({ seconds: e.target.value === '' ? null : Number(e.target.value) })
                    }
                  />
                </div>
                <div className="flex flex-col gap-1">
                  <label htmlFor={ids.drain} className="text-xs font-semibold">
                    Meanwhile the charge drains through
                  </label>
                  <select
                    id={ids.drain}
                    className={control}
                    value={attrs.drain ?? 'bleeder'}
                    onChange={(e) => updateAttributes({ drain: e.target.value })}
                  >
                    {DRAINS.map((d) => (
                      <option key={d.value} value={d.value}>
                        {d.label}
                      </option>
                    ))}
                  </select>
                </div>
              </>
            )}
            <label htmlFor={ids.live} className="flex min-h-9 items-center gap-2 text-sm">
              <input
                id={ids.live}
                type="checkbox"
                className="size-5"
                checked={attrs.live === true}
                onChange={(e) => updateAttributes({ live: e.target.checked ? true : null })}
              />
              Live work (unit powered)
            </label>
          </div>
          {thresholdProblem && (
            <p id={`${ids.threshold}-problem`} role="alert" className="text-xs text-out">
              {sentence('The threshold', thresholdProblem)}
            </p>
          )}
          {secondsProblem && (
            <p id={`${ids.seconds}-problem`} role="alert" className="text-xs text-out">
              {sentence('The wait', secondsProblem)}
            </p>
          )}
          <label htmlFor={ids.text} className="text-xs font-semibold">
            The technician confirms
          </label>
          <textarea
            id={ids.text}
            rows={2}
            maxLength={500}
            className="rounded border border-rule bg-card px-2 py-1 text-sm"
            value={attrs.text}
            placeholder="Reservoir and filter capacitors discharged and verified below 60 V with the meter."
            onChange={(e) => updateAttributes({ text: e.target.value })}
          />
          {!attrs.text.trim() && <p className="text-xs text-out">A check step needs the text to confirm.</p>}
        </div>
      </div>
    </BlockFrame>
  );
}
