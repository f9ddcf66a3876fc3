import { useState } from 'react';
import { Link } from 'react-router-dom';
import { formatUtc } from '@shared/runs/run-sheet-model';
import {
  SETTABLE_UNIT_STATES,
  UNIT_STATE_WORDS,
  unitStateBody,
  type UnitStateView,
} from '@shared/schemas/follow-ups';
import { SelectField, TextareaField } from '@/components/ui/field';
import { FormProblem } from '@/components/ui/form-problem';
import { paths } from '@/config/paths';
import { hasRole, useSession } from '@/features/auth/api/get-session';
import { showServerError, useZodForm } from '@/lib/form';
import { useSetUnitState } from '../api/follow-ups';

/** The unit's state now (following its run signatures), its history, and the form to change it by hand. */
export function UnitStatePanel({ unitId, states }: { unitId: string; states: UnitStateView[] }) {
  const user = useSession().data?.user;
  const [editing, setEditing] = useState(false);
  const now = states[0];
  return (
    <section aria-labelledby="unit-state" className="flex flex-col gap-2">
      <h2 id="unit-state" className="text-lg font-semibold">
        State:{' '}
        <span data-unit-state={now?.state ?? 'none'}>
          {now ? UNIT_STATE_WORDS[now.state] : 'not recorded yet'}
        </span>
      </h2>
      {states.length > 0 && (
        <ol className="flex flex-col gap-1 text-sm">
          {states.map((s, i) => (
            <li key={`${s.at}-${i}`} className="min-w-0 break-words">
              <span className="font-semibold">{UNIT_STATE_WORDS[s.state]}</span>{' '}
              <span className="value text-graphite-soft">{formatUtc(s.at)}</span>, {s.by.displayName}
              {s.runId && (
                <>
                  {' '}
                  (
                  <Link to={paths.runSheet.href(s.runId)} className="text-accent-deep underline">
                    {s.state === 'released' ? 'release signature' : 'performed signature'}
                  </Link>
                  )
                </>
              )}
              {s.reason && `: ${s.reason}`}
            </li>
          ))}
        </ol>
      )}
      {hasRole(user, 'technician', 'reviewer', 'admin') &&
        (editing ? (
          <StateForm unitId={unitId} onDone={() => setEditing(false)} />
        ) : (
          <button
            type="button"
            onClick={() => setEditing(true)}
            className="min-h-11 self-start rounded-md border border-rule bg-card px-4 font-semibold"
          >
            Change state
          </button>
        ))}
    </section>
  );
}

function StateForm({ unitId, onDone }: { unitId: string; onDone: () => void }) {
  const set = useSetUnitState(unitId);
  const form = useZodForm(unitStateBody, { defaultValues: { state: 'waiting_parts', reason: '' } });
  const submit = form.handleSubmit((body) =>
    set.mutate(body, { onError: (e) => showServerError(form, e), onSuccess: onDone }),
  );
  return (
    <form onSubmit={submit} noValidate aria-label="Change the unit state" className="flex flex-col gap-2">
      <FormProblem formState={form.formState} />
      <div className="grid gap-2 sm:grid-cols-[minmax(0,14rem)_minmax(0,1fr)]">
        <SelectField label="State" {...form.register('state')} error={form.formState.errors.state?.message}>
          {SETTABLE_UNIT_STATES.map((s) => (
            <option key={s} value={s}>
              {UNIT_STATE_WORDS[s]}
            </option>
          ))}
        </SelectField>
        <TextareaField
          label="Reason"
          {...form.register('reason')}
          error={form.formState.errors.reason?.message}
        />
      </div>
      <div className="flex gap-2">
        <button
          type="submit"
          disabled={set.isPending}
          className="min-h-12 rounded-md border border-accent-deep bg-accent px-4 font-semibold text-white disabled:opacity-50"
        >
          Record state
        </button>
        <button type="button" onClick={onDone} className="min-h-12 rounded-md border border-rule px-4">
          Cancel
        </button>
      </div>
    </form>
  );
}
