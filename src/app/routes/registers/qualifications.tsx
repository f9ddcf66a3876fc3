import { useEffect, useState } from 'react';
import { grantBody, QUALIFICATION_SCOPES, type QualificationView } from '@shared/schemas/registers';
import { Button } from '@/components/ui/button';
import { DataTable } from '@/components/ui/data-table';
import { Field, SelectField } from '@/components/ui/field';
import { FormProblem } from '@/components/ui/form-problem';
import { Loading } from '@/components/ui/loading';
import { Notice } from '@/components/ui/notice';
import { hasRole, useSession } from '@/features/auth/api/get-session';
import { useGrant, useQualifications, useWithdraw } from '@/features/registers/api/qualifications';
import { showServerError, useZodForm } from '@/lib/form';

const what = (q: QualificationView) =>
  q.scope === 'live' ? QUALIFICATION_SCOPES.live : `${q.family} procedures`;

function GrantForm({
  families,
  technicians,
}: {
  families: string[];
  technicians: { id: string; displayName: string }[];
}) {
  const grant = useGrant();
  const form = useZodForm(grantBody, {
    defaultValues: { personId: '', scope: 'family', family: '', note: '' },
  });
  const { errors } = form.formState;
  const scope = form.watch('scope');
  const submit = form.handleSubmit((body) =>
    grant.mutate(body, {
      onSuccess: () => form.reset({ personId: '', scope: body.scope, family: '', note: '' }),
      onError: (e) => showServerError(form, e),
    }),
  );
  return (
    <form
      onSubmit={submit}
      noValidate
      aria-label="Grant a qualification"
      className="flex flex-col gap-4 rounded-lg border border-rule bg-card p-5"
    >
      <h2 className="text-lg font-semibold">Grant a qualification</h2>
      <FormProblem formState={form.formState} />
      {grant.isSuccess && <Notice tone="success">Granted.</Notice>}
      <div className="grid grid-cols-1 gap-4 sm:grid-cols-2">
        <SelectField label="Technician" {...form.register('personId')} error={errors.personId?.message}>
          <option value="">Choose…</option>
          {technicians.map((p) => (
            <option key={p.id} value={p.id}>
              {p.displayName}
            </option>
          ))}
        </SelectField>
        <SelectField label="Qualified for" {...form.register('scope')} error={errors.scope?.message}>
          {Object.entries(QUALIFICATION_SCOPES).map(([k, words]) => (
            <option key={k} value={k}>
              {words}
            </option>
          ))}
        </SelectField>
        {scope === 'family' && (
          <Field
            label="Procedure family"
            list="procedure-families"
            {...form.register('family')}
            error={errors.family?.message}
          />
        )}
        <Field label="Note" {...form.register('note')} error={errors.note?.message} />
      </div>
      <datalist id="procedure-families">
        {families.map((f) => (
          <option key={f} value={f} />
        ))}
      </datalist>
      <Button type="submit" disabled={grant.isPending} className="self-start">
        Grant
      </Button>
    </form>
  );
}

function WithdrawButton({ q }: { q: QualificationView }) {
  const withdraw = useWithdraw();
  const [open, setOpen] = useState(false);
  const [reason, setReason] = useState('');
  if (!open)
    return (
      <button
        type="button"
        className="min-h-11 rounded-md border border-out px-3 text-sm font-semibold text-out hover:bg-out-wash"
        onClick={() => setOpen(true)}
        aria-label={`Withdraw ${what(q)} from ${q.person.displayName}`}
      >
        Withdraw
      </button>
    );
  return (
    <form
      className="flex flex-col gap-2"
      onSubmit={(e) => {
        e.preventDefault();
        withdraw.mutate({ id: q.id, reason });
      }}
    >
      <Field
        label="Reason for withdrawing"
        value={reason}
        onChange={(e) => setReason(e.target.value)}
        error={
          withdraw.error?.fields.find((f) => f.field === 'body.reason')?.reason ?? withdraw.error?.message
        }
      />
      <div className="flex gap-2">
        <Button type="submit" variant="danger" disabled={withdraw.isPending}>
          Withdraw
        </Button>
        <Button type="button" variant="quiet" onClick={() => setOpen(false)}>
          Cancel
        </Button>
      </div>
    </form>
  );
}

export default function QualificationsPage() {
  const session = useSession();
  const list = useQualifications();
  useEffect(() => {
    document.title = 'Qualifications · Benchwright';
  }, []);
  if (list.isPending) return <Loading />;
  if (list.isError) throw list.error;
  const keeper = hasRole(session.data?.user, 'reviewer', 'admin');
  const { qualifications, families, technicians } = list.data;
  return (
    <section className="flex flex-col gap-6">
      <header>
        <h1 className="text-2xl font-semibold">Qualifications</h1>
        <p className="text-sm text-graphite-soft">
          Who may run which procedure family alone, and who may do live work (any procedure with a hazard
          note). Anyone else is a trainee for that procedure: their run needs a qualified witness who co-signs
          it.
        </p>
      </header>
      <DataTable
        label="Qualifications"
        columns={['Technician', 'Qualified for', 'Granted', ...(keeper ? [''] : [])]}
      >
        {qualifications.map((q) => (
          <tr
            key={q.id}
            data-qualification={`${q.person.displayName}: ${what(q)}`}
            className="border-b border-rule last:border-0"
          >
            <td className="px-3 py-2 font-semibold">{q.person.displayName}</td>
            <td className="px-3 py-2">
              {what(q)}
              {q.note && <span className="block text-graphite-soft">{q.note}</span>}
            </td>
            <td className="px-3 py-2">
              {q.grantedBy.displayName}
              <span className="value block text-graphite-soft">{q.grantedAt.slice(0, 10)}</span>
            </td>
            {keeper && (
              <td className="px-3 py-2">
                <WithdrawButton q={q} />
              </td>
            )}
          </tr>
        ))}
      </DataTable>
      {keeper && <GrantForm families={families} technicians={technicians} />}
    </section>
  );
}
