import { useState, type FormEvent } from 'react';
import { useNavigate } from 'react-router-dom';
import { createProcedureBody } from '@shared/schemas/procedures';
import { Button } from '@/components/ui/button';
import { Field } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { paths } from '@/config/paths';
import { useCreateProcedure } from '../api/create-procedure';

/** Title, equipment, tags and nominal mains for a new procedure; on success, straight into the editor. */
export function NewProcedureForm() {
  const create = useCreateProcedure();
  const navigate = useNavigate();
  const [form, setForm] = useState({
    title: '',
    equipmentFamily: '',
    equipmentModel: '',
    tags: '',
    mainsNominal: '230',
    mainsFrequency: '50',
  });
  const [local, setLocal] = useState<Record<string, string>>({});
  const set = (key: keyof typeof form) => (e: React.ChangeEvent<HTMLInputElement>) =>
    setForm({ ...form, [key]: e.target.value });
  const fieldError = (name: string) =>
    local[name] ?? create.error?.fields.find((f) => f.field === `body.${name}`)?.reason;

  const submit = (e: FormEvent) => {
    e.preventDefault();
    const nominal = Number(form.mainsNominal);
    const body = {
      title: form.title,
      equipmentFamily: form.equipmentFamily,
      equipmentModel: form.equipmentModel,
      tags: form.tags
        .split(',')
        .map((t) => t.trim())
        .filter(Boolean),
      // The measured mains starts at the nominal value; a bench run replaces it.
      params: { mainsNominal: nominal, mainsVoltage: nominal, mainsFrequency: Number(form.mainsFrequency) },
    };
    const parsed = createProcedureBody.safeParse(body);
    if (!parsed.success) {
      setLocal(Object.fromEntries(parsed.error.issues.map((i) => [i.path.join('.'), i.message])));
      return;
    }
    setLocal({});
    create.mutate(parsed.data, { onSuccess: (d) => navigate(paths.editRevision.href(d.revision.id)) });
  };

  return (
    <form
      onSubmit={submit}
      noValidate
      className="flex max-w-2xl flex-col gap-4 rounded-lg border border-rule bg-card p-5"
    >
      {create.error && !create.error.fields.length && <Notice tone="error">{create.error.message}</Notice>}
      <Field
        label="Title"
        value={form.title}
        onChange={set('title')}
        error={fieldError('title')}
        placeholder="First power-up after a reservoir capacitor change"
      />
      <div className="grid gap-4 sm:grid-cols-2">
        <Field
          label="Equipment family"
          value={form.equipmentFamily}
          onChange={set('equipmentFamily')}
          error={fieldError('equipmentFamily')}
          placeholder="Guitar combo"
        />
        <Field
          label="Model"
          value={form.equipmentModel}
          onChange={set('equipmentModel')}
          error={fieldError('equipmentModel')}
          placeholder="TC-18"
        />
      </div>
      <Field
        label="Tags"
        value={form.tags}
        onChange={set('tags')}
        error={fieldError('tags')}
        hint="Comma-separated, e.g. power supply, first power-up"
      />
      <div className="grid gap-4 sm:grid-cols-2">
        <Field
          label="Nominal mains (V)"
          type="number"
          inputMode="decimal"
          value={form.mainsNominal}
          onChange={set('mainsNominal')}
          error={fieldError('params.mainsNominal')}
        />
        <Field
          label="Mains frequency (Hz)"
          type="number"
          inputMode="decimal"
          value={form.mainsFrequency}
          onChange={set('mainsFrequency')}
          error={fieldError('params.mainsFrequency')}
        />
      </div>
      <Button type="submit" disabled={create.isPending} className="self-start">
        {create.isPending ? 'Creating…' : 'Create and start writing'}
      </Button>
    </form>
  );
}
