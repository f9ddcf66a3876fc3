import { useNavigate } from 'react-router-dom';
import { z } from 'zod';
import { paramsSchema } from '@shared/document/params';
import { createProcedureBody, procedureMetaSchema } from '@shared/schemas/procedures';
import { Button } from '@/components/ui/button';
import { Field } from '@/components/ui/field';
import { FormProblem } from '@/components/ui/form-problem';
import { paths } from '@/config/paths';
import { labelOf, showServerError, useZodForm } from '@/lib/form';
import { useCreateProcedure } from '../api/create-procedure';

/** The server's rules, with tags typed as one comma-separated line and only the nominal mains asked for. */
const newProcedureForm = createProcedureBody
  .extend({
    tags: z
      .string()
      .transform((line) =>
        line
          .split(',')
          .map((t) => t.trim())
          .filter(Boolean),
      )
      .pipe(procedureMetaSchema.shape.tags),
    params: paramsSchema.pick({ mainsNominal: true, mainsFrequency: true }),
  })
  // The measured mains starts at the nominal value; a bench run replaces it.
  .transform(({ params, ...meta }) => ({
    ...meta,
    params: { ...params, mainsVoltage: params.mainsNominal },
  }));

/** Title, equipment, tags and nominal mains for a new procedure; on success, straight into the editor. */
export function NewProcedureForm() {
  const create = useCreateProcedure();
  const navigate = useNavigate();
  const form = useZodForm(newProcedureForm, {
    defaultValues: {
      title: '',
      equipmentFamily: '',
      equipmentModel: '',
      tags: '',
      params: { mainsNominal: 230, mainsFrequency: 50 },
    },
  });
  const { errors } = form.formState;
  const submit = form.handleSubmit((body) =>
    create.mutate(body, {
      onSuccess: (d) => navigate(paths.editRevision.href(d.revision.id)),
      onError: (e) => showServerError(form, e, { 'params.mainsVoltage': 'params.mainsNominal' }),
    }),
  );

  return (
    <form
      onSubmit={submit}
      noValidate
      className="flex max-w-2xl flex-col gap-4 rounded-lg border border-rule bg-card p-5"
    >
      <FormProblem formState={form.formState} />
      <Field
        label={labelOf(newProcedureForm, 'title')}
        {...form.register('title')}
        error={errors.title?.message}
        placeholder="First power-up after a reservoir capacitor change"
      />
      <div className="grid grid-cols-1 gap-4 sm:grid-cols-2">
        <Field
          label={labelOf(newProcedureForm, 'equipmentFamily')}
          {...form.register('equipmentFamily')}
          error={errors.equipmentFamily?.message}
          placeholder="Guitar combo"
        />
        <Field
          label={labelOf(newProcedureForm, 'equipmentModel')}
          {...form.register('equipmentModel')}
          error={errors.equipmentModel?.message}
          placeholder="TC-18"
        />
      </div>
      <Field
        label={labelOf(newProcedureForm, 'tags')}
        {...form.register('tags')}
        error={errors.tags?.message}
        hint="Comma-separated, e.g. power supply, first power-up"
      />
      <div className="grid grid-cols-1 gap-4 sm:grid-cols-2">
        <Field
          label="Nominal mains (V)"
          type="number"
          inputMode="decimal"
          {...form.register('params.mainsNominal', { valueAsNumber: true })}
          error={errors.params?.mainsNominal?.message}
        />
        <Field
          label="Mains frequency (Hz)"
          type="number"
          inputMode="decimal"
          {...form.register('params.mainsFrequency', { valueAsNumber: true })}
          error={errors.params?.mainsFrequency?.message}
        />
      </div>
      <Button type="submit" disabled={create.isPending} className="self-start">
        {create.isPending ? 'Creating…' : 'Create and start writing'}
      </Button>
    </form>
  );
}
