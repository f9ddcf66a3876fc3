import { useState, type FormEvent } from 'react';
import type { UnitView } from '@shared/schemas/units';
import { Button } from '@/components/ui/button';
import { Field } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { useSaveUnit } from '../api/save-unit';

/** Register a unit, or edit one (with its lock version, so two edits never silently overwrite). */
export function UnitForm({ unit, onSaved }: { unit?: UnitView; onSaved?: (u: UnitView) => void }) {
  const save = useSaveUnit();
  const [form, setForm] = useState({
    model: unit?.model ?? '',
    serial: unit?.serial ?? '',
    owner: unit?.owner ?? '',
    jobNumber: unit?.jobNumber ?? '',
    notes: unit?.notes ?? '',
  });
  const set = (k: keyof typeof form) => (e: { target: { value: string } }) =>
    setForm({ ...form, [k]: e.target.value });
  const fieldError = (name: string) => save.error?.fields.find((f) => f.field === `body.${name}`)?.reason;
  const submit = (e: FormEvent) => {
    e.preventDefault();
    save.mutate(
      { ...form, id: unit?.id, lockVersion: unit?.lockVersion },
      {
        onSuccess: (data) => {
          if (!unit) setForm({ model: form.model, serial: '', owner: '', jobNumber: '', notes: '' });
          onSaved?.(data.unit);
        },
      },
    );
  };
  return (
    <form
      onSubmit={submit}
      className="flex flex-col gap-4 rounded-lg border border-rule bg-card p-5"
      noValidate
      aria-label={unit ? 'Edit unit' : 'Register a unit'}
    >
      <h2 className="text-lg font-semibold">{unit ? 'Edit unit' : 'Register a unit'}</h2>
      {save.error && <Notice tone="error">{save.error.message}</Notice>}
      {save.isSuccess && unit && <Notice tone="success">Saved.</Notice>}
      <div className="grid gap-4 sm:grid-cols-2">
        <Field
          label="Model"
          value={form.model}
          onChange={set('model')}
          error={fieldError('model')}
          placeholder="TC-18"
          list="unit-models"
        />
        <Field label="Serial" value={form.serial} onChange={set('serial')} error={fieldError('serial')} />
        <Field label="Owner" value={form.owner} onChange={set('owner')} error={fieldError('owner')} />
        <Field
          label="Job number"
          value={form.jobNumber}
          onChange={set('jobNumber')}
          error={fieldError('jobNumber')}
        />
      </div>
      <label className="flex flex-col gap-1 text-sm font-semibold">
        Notes
        <textarea
          value={form.notes}
          onChange={set('notes')}
          rows={3}
          className="rounded-md border border-rule bg-card px-3 py-2 text-base font-normal"
        />
      </label>
      <datalist id="unit-models">
        <option value="TC-18" />
        <option value="TC-30H" />
        <option value="TC-5R" />
      </datalist>
      <Button type="submit" disabled={save.isPending} className="self-start">
        {unit ? 'Save unit' : 'Register unit'}
      </Button>
    </form>
  );
}
