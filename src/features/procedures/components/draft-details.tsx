import { useId } from 'react';
import { PARAM_SPECS } from '@shared/document/params';
import type { FieldProblem } from '@/lib/api-client';
import type { DraftFields } from '../draft/draft-fields';

type Details = Omit<DraftFields, 'document'>;

interface Props {
  value: Details;
  onChange: (next: Details) => void;
  problems: FieldProblem[];
}

const input = 'min-h-10 rounded border bg-card px-2 py-1 text-sm';

function Labelled({
  label,
  error,
  children,
}: {
  label: string;
  error?: string;
  children: (id: string) => React.ReactNode;
}) {
  const id = useId();
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className="text-xs font-semibold">
        {label}
      </label>
      {children(id)}
      {error && (
        <p className="text-xs text-out" role="alert">
          {error}
        </p>
      )}
    </div>
  );
}

/** Title, equipment, tags and the procedure's mains parameters, above the text. */
export function DraftDetails({ value, onChange, problems }: Props) {
  const err = (field: string) =>
    problems.find((p) => p.field === `body.${field}` || p.field.startsWith(`body.${field}.`))?.reason;
  const set = (patch: Partial<Details>) => onChange({ ...value, ...patch });
  return (
    <fieldset className="grid gap-3 rounded-lg border border-rule bg-card p-4 sm:grid-cols-2 lg:grid-cols-4">
      <legend className="px-1 text-sm font-semibold">Procedure details</legend>
      <div className="sm:col-span-2">
        <Labelled label="Title" error={err('title')}>
          {(id) => (
            <input
              id={id}
              className={`${input} w-full border-rule`}
              value={value.title}
              onChange={(e) => set({ title: e.target.value })}
            />
          )}
        </Labelled>
      </div>
      <Labelled label="Equipment family" error={err('equipmentFamily')}>
        {(id) => (
          <input
            id={id}
            className={`${input} border-rule`}
            value={value.equipmentFamily}
            onChange={(e) => set({ equipmentFamily: e.target.value })}
          />
        )}
      </Labelled>
      <Labelled label="Model" error={err('equipmentModel')}>
        {(id) => (
          <input
            id={id}
            className={`${input} border-rule`}
            value={value.equipmentModel}
            onChange={(e) => set({ equipmentModel: e.target.value })}
          />
        )}
      </Labelled>
      <div className="sm:col-span-2">
        <Labelled label="Tags (comma-separated)" error={err('tags')}>
          {(id) => (
            <input
              id={id}
              className={`${input} w-full border-rule`}
              defaultValue={value.tags.join(', ')}
              onChange={(e) =>
                set({
                  tags: e.target.value
                    .split(',')
                    .map((t) => t.trim())
                    .filter(Boolean),
                })
              }
            />
          )}
        </Labelled>
      </div>
      {PARAM_SPECS.map((p) => (
        <Labelled key={p.key} label={`${p.label} (${p.unit})`} error={err(`params.${p.key}`)}>
          {(id) => (
            <input
              id={id}
              type="number"
              inputMode="decimal"
              min={p.min}
              max={p.max}
              className={`${input} value border-rule`}
              value={Number.isFinite(value.params[p.key]) ? value.params[p.key] : ''}
              onChange={(e) => set({ params: { ...value.params, [p.key]: e.target.valueAsNumber } })}
            />
          )}
        </Labelled>
      ))}
    </fieldset>
  );
}
