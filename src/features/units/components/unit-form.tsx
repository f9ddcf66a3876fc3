import { unitBody, type UnitView } from '@shared/schemas/units';
import { Button } from '@/components/ui/button';
import { Field, TextareaField } from '@/components/ui/field';
import { FormProblem } from '@/components/ui/form-problem';
import { Notice } from '@/components/ui/notice';
import { labelOf, showServerError, useZodForm } from '@/lib/form';
import { useSaveUnit } from '../api/save-unit';
import { Link } from 'react-router-dom';
import { paths } from '@/config/paths';

/** Register a unit, or edit one (with its lock version, so two edits never silently overwrite). */
export function UnitForm({ unit, onSaved }: { unit?: UnitView; onSaved?: (u: UnitView) => void }) {
  const save = useSaveUnit();
  const form = useZodForm(unitBody, {
    defaultValues: {
      model: unit?.model ?? '',
      serial: unit?.serial ?? '',
      owner: unit?.owner ?? '',
      jobNumber: unit?.jobNumber ?? '',
      notes: unit?.notes ?? '',
    },
  });
  const { errors } = form.formState;
  const submit = form.handleSubmit((body) =>
    save.mutate(
      { ...body, id: unit?.id, lockVersion: unit?.lockVersion },
      {
        onSuccess: (data) => {
          // The next unit on the bench is often the same model.
          if (!unit) form.reset({ model: body.model, serial: '', owner: '', jobNumber: '', notes: '' });
          onSaved?.(data.unit);
        },
        onError: (e) => showServerError(form, e),
      },
    ),
  );
  return (
    <form
      onSubmit={submit}
      className="flex flex-col gap-4 rounded-lg border border-rule bg-card p-5"
      noValidate
      aria-label={unit ? 'Edit unit' : 'Register a unit'}
    >
      <h2 className="text-lg font-semibold">{unit ? 'Edit unit' : 'Register a unit'}</h2>
      <FormProblem formState={form.formState} />
      {save.isSuccess && unit && <Notice tone="success">Saved.</Notice>}
      {save.isSuccess && !unit && save.data && (
        <Notice tone="success">
          Registered {save.data.unit.model} serial {save.data.unit.serial}.{' '}
          <Link to={paths.unit.href(save.data.unit.id)} className="font-semibold underline">
            Open its page
          </Link>
        </Notice>
      )}
      <div className="grid grid-cols-1 gap-4 sm:grid-cols-2">
        <Field
          label={labelOf(unitBody, 'model')}
          {...form.register('model')}
          error={errors.model?.message}
          placeholder="TC-18"
          list="unit-models"
        />
        <Field
          label={labelOf(unitBody, 'serial')}
          {...form.register('serial')}
          error={errors.serial?.message}
        />
        <Field label={labelOf(unitBody, 'owner')} {...form.register('owner')} error={errors.owner?.message} />
        <Field
          label={labelOf(unitBody, 'jobNumber')}
          {...form.register('jobNumber')}
          error={errors.jobNumber?.message}
        />
      </div>
      <TextareaField
        label={labelOf(unitBody, 'notes')}
        rows={3}
        {...form.register('notes')}
        error={errors.notes?.message}
      />
      <datalist id="unit-models">
        <option value="TC-18" />
        <option value="TC-30H" />
        <option value="TC-5R" />
      </datalist>
      <Button type="submit" disabled={save.isPending} whyDisabled="Saving…" className="self-start">
        {unit ? 'Save unit' : 'Register unit'}
      </Button>
    </form>
  );
}
