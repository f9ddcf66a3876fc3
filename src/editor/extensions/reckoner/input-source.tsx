import { useId } from 'react';
import type { InputValue } from '@shared/document/schema';
import { PARAM_SPECS } from '@shared/document/params';
import type { FieldSpec } from '@shared/reckoners';
import { unitWithMeasure } from '@shared/reckoners/measures';
import { formatQuantity } from '@shared/units';
import { numericOutputs, useEvaluation } from '../../evaluation-context';

type Mode = 'value' | 'param' | 'ref';

const modeOf = (v: InputValue): Mode =>
  v && typeof v === 'object' && !Array.isArray(v)
    ? 'param' in v
      ? 'param'
      : 'ref' in v
        ? 'ref'
        : 'value'
    : 'value';

const isNumeric = (spec: FieldSpec) =>
  spec.kind === 'quantity' || spec.kind === 'number' || spec.kind === 'integer';

function placeholder(spec: FieldSpec): string {
  if (typeof spec.default === 'number')
    return spec.unit ? formatQuantity(spec.default, spec.unit, 4) : String(spec.default);
  return spec.optional ? 'optional' : '';
}

interface Props {
  spec: FieldSpec;
  value: InputValue;
  onChange: (value: InputValue) => void;
  errors: string[];
  /** The block being edited: its own outputs are not offered. */
  blockId: string;
  /** Inside a row table: no visible label (the column header names it). */
  compact?: boolean;
  labelSuffix?: string;
}

/** One reckoner input: a value as typed, a procedure parameter, or another block's output. */
export function InputSource({ spec, value, onChange, errors, blockId, compact, labelSuffix = '' }: Props) {
  const id = useId();
  const evaluation = useEvaluation();
  const mode = modeOf(value);
  const label = spec.label + labelSuffix;
  const unit = spec.unit ?? '';
  const measure = spec.measure ?? 'scalar';
  // Only quantities that fit the field are offered: same unit, and for volts and amps the same measure.
  const params = PARAM_SPECS.filter((p) => p.unit === unit && p.measure === measure);
  const outputs = numericOutputs(evaluation, { exceptId: blockId, unit, measure });
  const invalid = errors.length > 0;
  const control = `min-h-9 rounded border bg-card px-2 py-1 text-sm ${invalid ? 'border-out' : 'border-rule'}`;

  const switchMode = (next: Mode) => {
    if (next === 'value') onChange('');
    else if (next === 'param') onChange({ param: spec.follows ?? params[0]?.key ?? 'mainsNominal' });
    else onChange({ ref: outputs[0]?.ref ?? '' });
  };

  let editor;
  if (spec.kind === 'select') {
    editor = (
      <select
        id={id}
        aria-label={label}
        className={`${control} w-full min-w-0`}
        value={typeof value === 'string' ? value : ''}
        onChange={(e) => onChange(e.target.value)}
      >
        {spec.options?.map((o) => (
          <option key={o.value} value={o.value}>
            {o.label}
          </option>
        ))}
      </select>
    );
  } else if (mode === 'param') {
    const current = (value as { param: string }).param;
    editor = (
      <select
        id={id}
        aria-label={label}
        className={`${control} w-full min-w-0`}
        value={current}
        onChange={(e) => onChange({ param: e.target.value })}
      >
        {!params.some((p) => p.key === current) && (
          <option value={current}>
            {current} (not a {unit || 'plain'} parameter)
          </option>
        )}
        {params.map((p) => (
          <option key={p.key} value={p.key}>
            {p.label} ({evaluation.params[p.key]} {p.unit})
          </option>
        ))}
      </select>
    );
  } else if (mode === 'ref') {
    const current = (value as { ref: string }).ref;
    editor = (
      <select
        id={id}
        aria-label={label}
        className={`${control} value w-full min-w-0`}
        value={current}
        onChange={(e) => onChange({ ref: e.target.value })}
      >
        {!outputs.some((o) => o.ref === current) && (
          <option value={current}>{current || 'choose an output'} (not available)</option>
        )}
        {outputs.map((o) => (
          <option key={o.ref} value={o.ref}>
            {o.label} = {o.formatted}
          </option>
        ))}
      </select>
    );
  } else {
    editor = (
      <input
        id={id}
        aria-label={label}
        aria-invalid={invalid || undefined}
        className={`${control} value w-full min-w-20`}
        value={typeof value === 'number' ? String(value) : typeof value === 'string' ? value : ''}
        placeholder={placeholder(spec)}
        spellCheck={false}
        autoComplete="off"
        onChange={(e) => onChange(e.target.value)}
      />
    );
  }

  return (
    <div className="flex min-w-0 flex-col gap-1">
      {!compact && (
        <label htmlFor={id} className="text-xs font-semibold">
          {spec.label}
          {spec.unit ? (
            <span className="value font-normal text-graphite-soft">
              {' '}
              ({unitWithMeasure(spec.unit, spec.measure)})
            </span>
          ) : null}
        </label>
      )}
      <div className="flex items-center gap-1">
        {editor}
        {isNumeric(spec) && (
          <select
            aria-label={`${label}: source`}
            title="Where this input comes from"
            className="min-h-9 shrink-0 rounded border border-rule bg-paper px-1 text-xs"
            value={mode}
            onChange={(e) => switchMode(e.target.value as Mode)}
          >
            <option value="value">value</option>
            <option value="param" disabled={!params.length}>
              parameter
            </option>
            <option value="ref">from block</option>
          </select>
        )}
      </div>
      {errors.map((reason) => (
        <p key={reason} className="text-xs text-out" role="alert">
          {compact ? `${label}: ` : ''}
          {reason}
        </p>
      ))}
      {!compact && spec.help && !invalid && <p className="text-xs text-graphite-soft">{spec.help}</p>}
    </div>
  );
}
