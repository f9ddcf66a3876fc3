import { useId } from 'react';
import type { InputValue } from '@shared/document/schema';
import { WhyDisabled } from '@/components/ui/button';
import type { FieldSpec } from '@shared/reckoners';
import { initialInputs } from '@shared/reckoners/initial-inputs';
import { InputSource } from './input-source';

type Row = Record<string, InputValue>;

interface Props {
  spec: FieldSpec;
  value: InputValue;
  onChange: (rows: Row[]) => void;
  errorsAt: (path: string) => string[];
  blockId: string;
}

/** A row table input (windings, stages, heaters): one InputSource per cell, rows added and removed. */
export function RowsField({ spec, value, onChange, errorsAt, blockId }: Props) {
  const rows: Row[] = Array.isArray(value) ? (value as Row[]) : [];
  const columns = spec.columns ?? [];
  const max = spec.maxRows ?? 50;
  const setCell = (i: number, key: string, v: InputValue) =>
    onChange(rows.map((r, j) => (j === i ? { ...r, [key]: v } : r)));
  const tableErrors = errorsAt(spec.key);
  const whyId = useId();
  const min = spec.minRows ?? 0;
  const atMin = rows.length <= min;
  const atMax = rows.length >= max;

  return (
    <fieldset className="flex min-w-0 flex-col gap-2">
      <legend className="text-xs font-semibold">{spec.label}</legend>
      {rows.length === 0 ? (
        <p className="text-xs text-graphite-soft">No rows yet.</p>
      ) : (
        <div className="relative overflow-x-auto">
          <table className="w-full text-left text-sm">
            <thead>
              <tr>
                <th className="w-8 px-1 text-xs font-normal text-graphite-soft">#</th>
                {columns.map((c) => (
                  <th key={c.key} scope="col" className="px-1 text-xs font-semibold">
                    {c.label}
                    {c.unit ? (
                      <span className="value font-normal text-graphite-soft"> ({c.unit})</span>
                    ) : null}
                  </th>
                ))}
                <th>
                  <span className="sr-only">Remove</span>
                </th>
              </tr>
            </thead>
            <tbody>
              {rows.map((row, i) => (
                <tr key={i} className="align-top">
                  <td className="value px-1 py-2 text-xs text-graphite-soft">{i + 1}</td>
                  {columns.map((c) => (
                    <td key={c.key} className="px-1 py-1">
                      <InputSource
                        compact
                        spec={c}
                        labelSuffix={`, row ${i + 1}`}
                        value={row[c.key] ?? ''}
                        onChange={(v) => setCell(i, c.key, v)}
                        errors={errorsAt(`${spec.key}.${i}.${c.key}`).concat(errorsAt(`${spec.key}.${i}`))}
                        blockId={blockId}
                      />
                    </td>
                  ))}
                  <td className="px-1 py-1">
                    <button
                      type="button"
                      className="min-h-9 rounded border border-rule px-2 text-xs hover:bg-out-wash"
                      aria-label={`Remove ${spec.label.toLowerCase()} row ${i + 1}`}
                      disabled={atMin}
                      aria-describedby={atMin ? `${whyId}-min` : undefined}
                      onClick={() => onChange(rows.filter((_, j) => j !== i))}
                    >
                      Remove
                    </button>
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
      {tableErrors.map((reason) => (
        <p key={reason} className="text-xs text-out" role="alert">
          {reason}
        </p>
      ))}
      <button
        type="button"
        className="self-start rounded border border-rule bg-card px-3 py-1 text-xs hover:bg-paper-deep disabled:opacity-50"
        disabled={atMax}
        aria-describedby={atMax ? `${whyId}-max` : undefined}
        onClick={() => onChange([...rows, initialInputs(columns)])}
      >
        Add row
      </button>
      <WhyDisabled
        id={`${whyId}-min`}
        why={
          atMin && rows.length > 0 && `At least ${min} row${min === 1 ? '' : 's'}: a row cannot be removed.`
        }
      />
      <WhyDisabled id={`${whyId}-max`} why={atMax && `At most ${max} rows.`} />
    </fieldset>
  );
}
