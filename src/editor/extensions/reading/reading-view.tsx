import { useId } from 'react';
import type { NodeViewProps } from '@tiptap/react';
import type { ReadingAttrs } from '@shared/document/schema';
import { readingMeasure } from '@shared/document/upgrade';
import { HOLD_POINT_WORDS } from '@shared/document/nodes';
import { MEASURE_WORDS } from '@shared/reckoners/measures';
import {
  LIVE_READING_UNITS,
  READING_MEASURES,
  READING_UNITS,
  takesMeasure,
} from '@shared/reckoners/reading-units';
import { numericOutputs, readingResult, useEvaluation } from '../../evaluation-context';
import { BlockFrame } from '../block-frame';

const UNITS = READING_UNITS;
const MAINS_CHOICES = [
  { value: 'unset', label: 'not stated' },
  { value: 'scales', label: 'scales with the mains' },
  { value: 'fixed', label: 'fixed (does not follow the mains)' },
] as const;
/** Whether the reading is taken on a powered unit; unset follows the unit (see isLiveReading). */
const LIVE_CHOICES = [
  { value: 'unset', label: `by its unit (live for ${LIVE_READING_UNITS.join(', ')})` },
  { value: 'live', label: 'live: on a powered unit' },
  { value: 'cold', label: 'not live: unit switched off' },
] as const;
const control = 'min-h-9 rounded border border-rule bg-card px-2 py-1 text-sm';

function TextInput({
  label,
  value,
  onChange,
  mono,
  placeholder,
}: {
  label: string;
  value: string;
  onChange: (v: string) => void;
  mono?: boolean;
  placeholder?: string;
}) {
  const id = useId();
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className="text-xs font-semibold">
        {label}
      </label>
      <input
        id={id}
        className={`${control} ${mono ? 'value' : ''}`}
        value={value}
        placeholder={placeholder}
        onChange={(e) => onChange(e.target.value)}
      />
    </div>
  );
}

export function ReadingView({ node, updateAttributes, deleteNode, selected }: NodeViewProps) {
  const attrs = node.attrs as ReadingAttrs;
  const evaluation = useEvaluation();
  const ids = {
    unit: useId(),
    measure: useId(),
    source: useId(),
    expected: useId(),
    mains: useId(),
    live: useId(),
    hold: useId(),
  };
  const resolved = readingResult(evaluation, attrs.id);
  const fromBlock = 'ref' in attrs.expected;
  const measure = readingMeasure(attrs);
  const outputs = numericOutputs(evaluation, { unit: attrs.unit, measure: measure ?? 'scalar' });
  const mainsChoice = attrs.followsMains == null ? 'unset' : attrs.followsMains ? 'scales' : 'fixed';
  const liveChoice = attrs.live == null ? 'unset' : attrs.live ? 'live' : 'cold';
  const set = (patch: Partial<ReadingAttrs>) => updateAttributes(patch);

  return (
    <BlockFrame blockId={attrs.id} selected={selected} onRemove={deleteNode} title="Reading">
      <div className="grid grid-cols-1 gap-3 sm:grid-cols-3">
        <TextInput
          label="What to measure"
          value={attrs.label}
          onChange={(label) => set({ label })}
          placeholder="B+ at the reservoir"
        />
        <TextInput
          label="Where (test point)"
          value={attrs.testPoint}
          onChange={(testPoint) => set({ testPoint })}
          placeholder="TP3 to chassis"
        />
        <TextInput
          label="Meter range"
          value={attrs.meterRange}
          onChange={(meterRange) => set({ meterRange })}
          mono
          placeholder="1000 V DC"
        />
        <div className="flex flex-col gap-1">
          <label htmlFor={ids.unit} className="text-xs font-semibold">
            Unit
          </label>
          <div className="flex gap-1">
            <select
              id={ids.unit}
              className={`${control} value`}
              value={attrs.unit}
              onChange={(e) => {
                const unit = e.target.value as ReadingAttrs['unit'];
                set({ unit, measure: takesMeasure(unit) ? (attrs.measure ?? 'dc') : null });
              }}
            >
              {UNITS.map((u) => (
                <option key={u} value={u}>
                  {u}
                </option>
              ))}
            </select>
            {measure && (
              <select
                id={ids.measure}
                aria-label="Measure"
                className={control}
                value={measure}
                onChange={(e) => set({ measure: e.target.value as NonNullable<ReadingAttrs['measure']> })}
              >
                {READING_MEASURES.map((m) => (
                  <option key={m} value={m}>
                    {MEASURE_WORDS[m]}
                  </option>
                ))}
              </select>
            )}
          </div>
        </div>
        <div className="flex flex-col gap-1">
          <div className="flex items-center justify-between gap-2">
            <label htmlFor={ids.expected} className="text-xs font-semibold">
              Expected value
            </label>
            <select
              id={ids.source}
              aria-label="Expected value: source"
              className="min-h-7 rounded border border-rule bg-paper px-1 text-xs"
              value={fromBlock ? 'ref' : 'literal'}
              onChange={(e) =>
                set({ expected: e.target.value === 'ref' ? { ref: outputs[0]?.ref ?? '' } : { literal: '' } })
              }
            >
              <option value="literal">value</option>
              <option value="ref">from block</option>
            </select>
          </div>
          {'ref' in attrs.expected ? (
            <select
              id={ids.expected}
              className={`${control} value`}
              value={attrs.expected.ref}
              onChange={(e) => set({ expected: { ref: e.target.value } })}
            >
              {!outputs.some((o) => o.ref === (attrs.expected as { ref: string }).ref) && (
                <option value={attrs.expected.ref}>
                  {attrs.expected.ref || `choose an output in ${attrs.unit}`} (not available)
                </option>
              )}
              {outputs.map((o) => (
                <option key={o.ref} value={o.ref}>
                  {o.label} = {o.formatted}
                </option>
              ))}
            </select>
          ) : (
            <input
              id={ids.expected}
              className={`${control} value`}
              value={attrs.expected.literal}
              placeholder={`350 ${attrs.unit}`}
              onChange={(e) => set({ expected: { literal: e.target.value } })}
            />
          )}
        </div>
        <TextInput
          label="Tolerance (% or a unit)"
          value={attrs.tolerance}
          onChange={(tolerance) => set({ tolerance })}
          mono
          placeholder="±5 %"
        />
        {!fromBlock && attrs.unit === 'V' && (
          <div className="flex flex-col gap-1">
            <label htmlFor={ids.mains} className="text-xs font-semibold">
              Typed value at other mains
            </label>
            <select
              id={ids.mains}
              className={control}
              value={mainsChoice}
              onChange={(e) =>
                set({ followsMains: e.target.value === 'unset' ? null : e.target.value === 'scales' })
              }
            >
              {MAINS_CHOICES.map((c) => (
                <option key={c.value} value={c.value}>
                  {c.label}
                </option>
              ))}
            </select>
          </div>
        )}
        <div className="flex flex-col gap-1">
          <label htmlFor={ids.live} className="text-xs font-semibold">
            Live work
          </label>
          <select
            id={ids.live}
            className={control}
            value={liveChoice}
            onChange={(e) =>
              updateAttributes({ live: e.target.value === 'unset' ? null : e.target.value === 'live' })
            }
          >
            {LIVE_CHOICES.map((c) => (
              <option key={c.value} value={c.value}>
                {c.label}
              </option>
            ))}
          </select>
        </div>
        <label htmlFor={ids.hold} className="flex min-h-11 items-center gap-2 text-sm sm:col-span-3">
          <input
            id={ids.hold}
            type="checkbox"
            className="size-5"
            checked={attrs.holdPoint === true}
            onChange={(e) => updateAttributes({ holdPoint: e.target.checked ? true : null })}
          />
          <span>
            <strong>Hold point</strong>: {HOLD_POINT_WORDS}
          </span>
        </label>
      </div>
      <p className="mt-3 text-sm" data-reading-band aria-live="polite">
        {resolved?.bandText ? (
          <>
            Expected band: <span className="value font-semibold">{resolved.bandText}</span>
          </>
        ) : (
          <span className="text-out" role="alert">
            No expected band: {resolved?.error ?? evaluation.failure ?? 'not evaluated yet'}.
          </span>
        )}
      </p>
    </BlockFrame>
  );
}
