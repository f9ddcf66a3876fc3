import { useEffect } from 'react';
import { z } from 'zod';
import { PARAM_SPECS, paramsSchema, type ProcedureParams } from '@shared/document/params';
import { procedureMetaSchema } from '@shared/schemas/procedures';
import { Field } from '@/components/ui/field';
import type { FieldProblem } from '@/lib/api-client';
import { labelOf, setFieldProblems, useZodForm } from '@/lib/form';
import type { DraftFields } from '../draft/draft-fields';

type Details = Omit<DraftFields, 'document'>;

interface Props {
  value: Details;
  onChange: (next: Details) => void;
  /** What the server refused at the last save. */
  problems: FieldProblem[];
}

const input = 'min-h-10 rounded border bg-card px-2 py-1 text-sm';
const splitTags = (line = '') =>
  line
    .split(',')
    .map((t) => t.trim())
    .filter(Boolean);

/** The server's rules for a draft's details, with tags typed as one comma-separated line. */
const detailsForm = procedureMetaSchema.extend({
  tags: z.string().transform(splitTags).pipe(procedureMetaSchema.shape.tags),
  params: paramsSchema,
});

/** Title, equipment, tags and the procedure's mains parameters, above the text; checked as typed. */
export function DraftDetails({ value, onChange, problems }: Props) {
  const form = useZodForm(detailsForm, {
    mode: 'onChange',
    defaultValues: { ...value, tags: value.tags.join(', ') },
  });
  const { errors } = form.formState;
  // The draft saves itself: every edit goes to it as typed, and the server refuses what the rules refuse.
  useEffect(() => {
    const watching = form.watch((v) =>
      onChange({
        title: v.title ?? '',
        equipmentFamily: v.equipmentFamily ?? '',
        equipmentModel: v.equipmentModel ?? '',
        tags: splitTags(v.tags),
        // Every parameter has its input, so the watched values hold them all (NaN while emptied).
        params: v.params as ProcedureParams,
      }),
    );
    return () => watching.unsubscribe();
  }, [form, onChange]);
  useEffect(() => {
    setFieldProblems(form, problems);
  }, [form, problems]);
  return (
    <fieldset className="grid grid-cols-1 gap-3 rounded-lg border border-rule bg-card p-4 sm:grid-cols-2 lg:grid-cols-4">
      <legend className="px-1 text-sm font-semibold">Procedure details</legend>
      <div className="sm:col-span-2">
        <Field
          label={labelOf(detailsForm, 'title')}
          className={`${input} w-full`}
          {...form.register('title')}
          error={errors.title?.message}
        />
      </div>
      <Field
        label={labelOf(detailsForm, 'equipmentFamily')}
        className={input}
        {...form.register('equipmentFamily')}
        error={errors.equipmentFamily?.message}
      />
      <Field
        label={labelOf(detailsForm, 'equipmentModel')}
        className={input}
        {...form.register('equipmentModel')}
        error={errors.equipmentModel?.message}
      />
      <div className="sm:col-span-2">
        <Field
          label="Tags (comma-separated)"
          className={`${input} w-full`}
          {...form.register('tags')}
          error={errors.tags?.message}
        />
      </div>
      {PARAM_SPECS.map((p) => (
        <Field
          key={p.key}
          label={`${p.label} (${p.unit})`}
          type="number"
          inputMode="decimal"
          min={p.min}
          max={p.max}
          className={`${input} value`}
          {...form.register(`params.${p.key}`, { valueAsNumber: true })}
          error={errors.params?.[p.key]?.message}
        />
      ))}
    </fieldset>
  );
}
