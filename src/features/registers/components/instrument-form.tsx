import { INSTRUMENT_KINDS, instrumentBody, type InstrumentView } from '@shared/schemas/registers';
import { Button } from '@/components/ui/button';
import { Field, SelectField } from '@/components/ui/field';
import { FormProblem } from '@/components/ui/form-problem';
import { Notice } from '@/components/ui/notice';
import { showServerError, useZodForm } from '@/lib/form';
import { useSaveInstrument } from '../api/instruments';

/** Add an instrument to the register, or edit one (with its lock version). */
export function InstrumentForm({ instrument, onDone }: { instrument?: InstrumentView; onDone?: () => void }) {
  const save = useSaveInstrument();
  const form = useZodForm(instrumentBody, {
    defaultValues: {
      identifier: instrument?.identifier ?? '',
      kind: instrument?.kind ?? 'meter',
      description: instrument?.description ?? '',
      calibrationDue: instrument?.calibrationDue ?? '',
    },
  });
  const { errors } = form.formState;
  const submit = form.handleSubmit((body) =>
    save.mutate(
      { ...body, id: instrument?.id, lockVersion: instrument?.lockVersion },
      {
        onSuccess: () => {
          if (!instrument)
            form.reset({ identifier: '', kind: body.kind, description: '', calibrationDue: '' });
          onDone?.();
        },
        onError: (e) => showServerError(form, e),
      },
    ),
  );
  const title = instrument ? `Edit ${instrument.identifier}` : 'Add an instrument';
  return (
    <form
      onSubmit={submit}
      noValidate
      aria-label={title}
      className="flex flex-col gap-4 rounded-lg border border-rule bg-card p-5"
    >
      <h2 className="text-lg font-semibold">{title}</h2>
      <FormProblem formState={form.formState} />
      {save.isSuccess && !instrument && (
        <Notice tone="success">Added {save.data.instrument.identifier}.</Notice>
      )}
      <div className="grid grid-cols-1 gap-4 sm:grid-cols-2">
        <Field label="Identifier" {...form.register('identifier')} error={errors.identifier?.message} />
        <SelectField label="Kind" {...form.register('kind')} error={errors.kind?.message}>
          {Object.entries(INSTRUMENT_KINDS).map(([k, words]) => (
            <option key={k} value={k}>
              {words}
            </option>
          ))}
        </SelectField>
        <Field label="Description" {...form.register('description')} error={errors.description?.message} />
        <Field
          label="Calibration due"
          type="date"
          {...form.register('calibrationDue')}
          error={errors.calibrationDue?.message}
        />
      </div>
      <div className="flex flex-wrap gap-2">
        <Button type="submit" disabled={save.isPending}>
          {instrument ? 'Save instrument' : 'Add instrument'}
        </Button>
        {instrument && (
          <Button type="button" variant="quiet" onClick={onDone}>
            Cancel
          </Button>
        )}
      </div>
    </form>
  );
}
