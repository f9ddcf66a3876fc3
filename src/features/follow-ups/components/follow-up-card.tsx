import { useState } from 'react';
import { Link } from 'react-router-dom';
import { followUpFields } from '@shared/runs/run-sheet-model';
import {
  DISPOSITION_WORDS,
  DISPOSITIONS,
  dispositionBody,
  ownerBody,
  type FollowUpView,
} from '@shared/schemas/follow-ups';
import { SelectField, TextareaField } from '@/components/ui/field';
import { FormProblem } from '@/components/ui/form-problem';
import { paths } from '@/config/paths';
import { hasRole, useSession } from '@/features/auth/api/get-session';
import { useQualifications } from '@/features/registers/api/qualifications';
import { Fields } from '@/features/runs/components/run-sheet';
import { showServerError, useZodForm } from '@/lib/form';
import { useDecideFollowUp, useReassignFollowUp } from '../api/follow-ups';

/** One follow-up: the readings, owner, disposition and closure, with what the signed-in person may do. */
export function FollowUpCard({ followUp: f, showRun = true }: { followUp: FollowUpView; showRun?: boolean }) {
  const user = useSession().data?.user;
  const staff = hasRole(user, 'reviewer', 'admin');
  const mayDecide = !f.closed && (staff || f.owner.id === user?.id);
  return (
    <article
      aria-label={`Follow-up on ${f.unit.model} ${f.unit.serial}`}
      data-follow-up={f.closed ? 'closed' : 'open'}
      className={`flex min-w-0 flex-col gap-2 rounded-lg border bg-card p-4 ${f.closed ? 'border-rule' : 'border-out'}`}
    >
      <header className="flex flex-wrap items-baseline gap-x-3 gap-y-1">
        <h3 className="font-semibold">
          <Link to={paths.unit.href(f.unit.id)} className="underline">
            {f.unit.model} · <span className="value">{f.unit.serial}</span>
          </Link>
        </h3>
        <span className={f.closed ? 'text-sm text-ok' : 'text-sm font-semibold text-out'}>
          {f.closed ? 'Closed' : 'Open'}
        </span>
        {showRun && (
          <Link to={paths.runSheet.href(f.run.id)} className="text-sm text-accent-deep underline">
            {f.run.title} (run sheet)
          </Link>
        )}
      </header>
      <Fields fields={followUpFields(f)} />
      {f.closed?.run && (
        <p className="text-sm">
          Closed by{' '}
          <Link to={paths.runSheet.href(f.closed.run.id)} className="text-accent-deep underline">
            the passing re-run
          </Link>
          .
        </p>
      )}
      {mayDecide && <DispositionForm followUp={f} reviewer={hasRole(user, 'reviewer')} />}
      {!f.closed && staff && <ReassignForm followUp={f} />}
    </article>
  );
}

function DispositionForm({ followUp, reviewer }: { followUp: FollowUpView; reviewer: boolean }) {
  const decide = useDecideFollowUp(followUp.id);
  const form = useZodForm(dispositionBody, {
    defaultValues: { disposition: followUp.disposition ? 'return' : 'repair', reason: '' },
  });
  const choices = DISPOSITIONS.filter((d) => d !== 'accept' || reviewer);
  const submit = form.handleSubmit((body) =>
    decide.mutate(body, { onError: (e) => showServerError(form, e), onSuccess: () => form.reset() }),
  );
  return (
    <form onSubmit={submit} noValidate aria-label="Record a disposition" className="flex flex-col gap-2">
      <FormProblem formState={form.formState} />
      <div className="grid gap-2 sm:grid-cols-[minmax(0,16rem)_minmax(0,1fr)]">
        <SelectField
          label="Disposition"
          {...form.register('disposition')}
          error={form.formState.errors.disposition?.message}
        >
          {choices.map((d) => (
            <option key={d} value={d}>
              {DISPOSITION_WORDS[d]}
            </option>
          ))}
        </SelectField>
        <TextareaField
          label="Reason"
          hint="Needed to accept or to return unrepaired."
          {...form.register('reason')}
          error={form.formState.errors.reason?.message}
        />
      </div>
      <button
        type="submit"
        disabled={decide.isPending}
        className="min-h-12 self-start rounded-md border border-rule bg-paper px-4 font-semibold disabled:opacity-50"
      >
        Record disposition
      </button>
    </form>
  );
}

function ReassignForm({ followUp }: { followUp: FollowUpView }) {
  const [open, setOpen] = useState(false);
  const people = useQualifications();
  const reassign = useReassignFollowUp(followUp.id);
  const form = useZodForm(ownerBody, { defaultValues: { ownerId: followUp.owner.id } });
  if (!open)
    return (
      <button
        type="button"
        onClick={() => setOpen(true)}
        className="min-h-11 self-start text-sm font-semibold text-accent-deep underline"
      >
        Give to another owner
      </button>
    );
  const submit = form.handleSubmit((body) =>
    reassign.mutate(body, { onError: (e) => showServerError(form, e), onSuccess: () => setOpen(false) }),
  );
  return (
    <form onSubmit={submit} noValidate aria-label="Give to another owner" className="flex flex-col gap-2">
      <FormProblem formState={form.formState} />
      <div className="max-w-sm">
        <SelectField
          label="Owner"
          {...form.register('ownerId')}
          error={form.formState.errors.ownerId?.message}
        >
          {(people.data?.technicians ?? [followUp.owner]).map((p) => (
            <option key={p.id} value={p.id}>
              {p.displayName}
            </option>
          ))}
        </SelectField>
      </div>
      <button
        type="submit"
        disabled={reassign.isPending}
        className="min-h-12 self-start rounded-md border border-rule bg-paper px-4 font-semibold disabled:opacity-50"
      >
        Give it to them
      </button>
    </form>
  );
}
