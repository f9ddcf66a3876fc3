import { useId } from 'react';
import type { NodeViewProps } from '@tiptap/react';
import type { InputValue, ReckonerAttrs } from '@shared/document/schema';
import { BLOCK_NAME } from '@shared/document/schema';
import { inputLabel } from '@shared/document/block-view';
import { getReckoner, listReckoners } from '@shared/reckoners';
import { withLabel } from '@shared/schemas/problems';
import { blockResult, useEvaluation } from '../../evaluation-context';
import { BlockFrame } from '../block-frame';
import { InputSource } from './input-source';
import { ReckonerResults } from './reckoner-results';
import { RowsField } from './rows-field';
import { initialInputs } from '@shared/reckoners/initial-inputs';

export function ReckonerView({ node, updateAttributes, deleteNode, selected }: NodeViewProps) {
  const attrs = node.attrs as ReckonerAttrs;
  const evaluation = useEvaluation();
  const nameId = useId();
  const def = getReckoner(attrs.kind);
  const result = blockResult(evaluation, attrs.id);
  const errors = result && !result.ok ? result.errors : [];
  const fields = def?.fields ?? [];

  // Errors are shown at the input they name; whatever no input claims is listed under the form.
  const claimed = new Set<string>();
  for (const f of fields) {
    claimed.add(f.key);
    const rows = attrs.inputs[f.key];
    if (f.kind !== 'rows' || !Array.isArray(rows)) continue;
    rows.forEach((_, i) => {
      claimed.add(`${f.key}.${i}`);
      for (const c of f.columns ?? []) claimed.add(`${f.key}.${i}.${c.key}`);
    });
  }
  // Each problem as a sentence naming its input as the form labels it ("Winding 1 voltage is required").
  const errorsAt = (path: string) =>
    errors.filter((e) => e.field === path).map((e) => withLabel(inputLabel(fields, path), e.reason));
  const setInput = (key: string, value: InputValue | Record<string, InputValue>[]) =>
    updateAttributes({ inputs: { ...attrs.inputs, [key]: value } });
  const nameProblem = BLOCK_NAME.test(attrs.name)
    ? null
    : 'A name starts with a letter and holds only letters, digits, - or _ (at most 32).';

  const form = fields.map((f) =>
    f.kind === 'rows' ? (
      <div key={f.key} className="sm:col-span-2">
        <RowsField
          spec={f}
          value={attrs.inputs[f.key] ?? []}
          onChange={(rows) => setInput(f.key, rows)}
          errorsAt={errorsAt}
          blockId={attrs.id}
        />
      </div>
    ) : (
      <InputSource
        key={f.key}
        spec={f}
        value={attrs.inputs[f.key] ?? ''}
        onChange={(v) => setInput(f.key, v)}
        errors={errorsAt(f.key)}
        blockId={attrs.id}
      />
    ),
  );
  const unclaimed = errors.filter((e) => !claimed.has(e.field) && !(e.field === 'name' && nameProblem));

  return (
    <BlockFrame
      blockId={attrs.id}
      selected={selected}
      onRemove={deleteNode}
      title={<>Reckoner · {def?.label ?? 'unknown kind'}</>}
      headerExtra={
        <select
          aria-label="Reckoner kind"
          className="min-h-9 rounded border border-rule bg-card px-2 text-xs"
          value={attrs.kind}
          onChange={(e) => {
            const next = getReckoner(e.target.value);
            if (next) updateAttributes({ kind: next.kind, inputs: initialInputs(next.fields) });
          }}
        >
          {!def && <option value={attrs.kind}>{attrs.kind} (unknown)</option>}
          {listReckoners().map((r) => (
            <option key={r.kind} value={r.kind}>
              {r.label}
            </option>
          ))}
        </select>
      }
    >
      <div className="flex flex-wrap items-end gap-3">
        <div className="flex flex-col gap-1">
          <label htmlFor={nameId} className="text-xs font-semibold">
            Block name
          </label>
          <input
            id={nameId}
            className={`value min-h-9 w-40 rounded border bg-card px-2 text-sm ${nameProblem ? 'border-out' : 'border-rule'}`}
            value={attrs.name}
            spellCheck={false}
            onChange={(e) => updateAttributes({ name: e.target.value.trim() })}
          />
        </div>
        {def && <p className="max-w-prose flex-1 text-xs text-graphite-soft">{def.summary}</p>}
      </div>
      {nameProblem && (
        <p className="mt-1 text-xs text-out" role="alert">
          {nameProblem}
        </p>
      )}
      <div className="mt-3 grid grid-cols-1 gap-3 sm:grid-cols-2">{form}</div>
      <ReckonerResults
        result={result}
        unclaimed={unclaimed}
        failure={evaluation.failure}
        readings={evaluation.snapshot?.readings}
      />
    </BlockFrame>
  );
}
