import { useEffect, useState } from 'react';
import { Link, useNavigate } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { readMeasured } from '@shared/reckoners/measurement';
import type { ProcedureListItem } from '@shared/schemas/procedures';
import { startRunBody } from '@shared/schemas/runs';
import { FormProblem } from '@/components/ui/form-problem';
import { Notice } from '@/components/ui/notice';
import { showServerError, useZodForm } from '@/lib/form';
import { useDebounced } from '@/hooks/use-debounced';
import { revisionQueryOptions } from '@/features/procedures/api/get-revision';
import { useRevisionParams, useRunnableProcedures } from '../api/get-runnable-procedures';
import { useStartRun } from '../api/start-run';
import { useInstruments } from '@/features/registers/api/instruments';
import { useEligibility } from '@/features/registers/api/qualifications';
import { INSTRUMENT_KINDS } from '@shared/schemas/registers';
import {
  localToday,
  PAPER_SHEET_RENAME,
  PaperSheetFields,
  paperSheetOf,
} from '@/features/paper-sheets/components/paper-sheet-fields';

/** The bench's usual instrument, remembered on this device from the last run started here. */
const USUAL = 'bw.usual-instrument';

interface UnitOption {
  id: string;
  model: string;
  serial: string;
  owner: string;
  jobNumber: string;
}

const select = 'min-h-12 rounded-md border border-rule bg-card px-3 text-base';

/**
 * Mains as measured, typed as at the bench: volts rms ("236", "236 VAC"; a peak or DC figure is
 * refused), or hertz; then the server's range for it. Empty is undefined (the frequency has a default).
 */
const mains = (unit: 'V' | 'Hz', range: z.ZodType<number, number>) =>
  z
    .string()
    .transform((text, ctx) => {
      if (!text.trim()) return undefined;
      const r = readMeasured(text, unit, unit === 'V' ? 'rms' : undefined);
      if (r.ok) return r.measured;
      ctx.addIssue({ code: 'custom', message: r.reason });
      return z.NEVER;
    })
    .pipe(range.optional());

const startRunForm = z.object({
  procedureId: z.string().min(1, 'Choose a procedure').meta({ title: 'Approved procedure' }),
  unitId: z.string().min(1, 'Choose the unit on the bench').pipe(startRunBody.shape.unitId),
  mainsVoltage: mains('V', startRunBody.shape.mainsVoltage).pipe(
    z.number('Enter the mains measured at the bench'),
  ),
  mainsFrequency: mains('Hz', startRunBody.shape.mainsFrequency),
  witnessId: z.string(),
  instrumentId: z.string(),
  /** The readings are copied from a paper bench sheet: its date and identifier. */
  fromPaper: z.boolean(),
  paperDate: z.string(),
  paperRef: z.string(),
});

/** Pick an approved procedure and a unit, enter the mains measured at the bench, and start. */
export function StartRunForm({
  units,
  initialUnitId,
  initialRevisionId,
  runPath,
}: {
  units: UnitOption[];
  initialUnitId?: string;
  /** Opened from a procedure's approved revision: that procedure comes chosen. */
  initialRevisionId?: string;
  runPath: (id: string) => string;
}) {
  const navigate = useNavigate();
  const [find, setFind] = useState('');
  const q = useDebounced(find.trim(), 250);
  const procedures = useRunnableProcedures(q);
  const start = useStartRun();
  const form = useZodForm(startRunForm, {
    defaultValues: {
      procedureId: '',
      unitId: initialUnitId ?? '',
      mainsVoltage: '',
      mainsFrequency: '',
      witnessId: '',
      instrumentId: localStorage.getItem(USUAL) ?? '',
      fromPaper: false,
      paperDate: localToday(),
      paperRef: '',
    },
  });
  const instruments = useInstruments();
  const { errors } = form.formState;
  const procedureId = form.watch('procedureId');
  const { setValue } = form;
  // The chosen procedure stays chosen when a new title search no longer lists it.
  const [chosen, setChosen] = useState<ProcedureListItem | undefined>();
  const opened = useQuery({ ...revisionQueryOptions(initialRevisionId ?? ''), enabled: !!initialRevisionId });
  useEffect(() => {
    const r = opened.data?.revision;
    if (!r || r.state !== 'approved' || procedureId) return;
    setValue('procedureId', r.procedureId);
    setChosen({
      id: r.procedureId,
      title: r.title,
      equipmentFamily: r.equipmentFamily,
      equipmentModel: r.equipmentModel,
      tags: r.tags,
      owner: r.author,
      latest: { id: r.id, number: r.number, state: r.state, updatedAt: r.updatedAt },
      approved: { id: r.id, number: r.number },
      updatedAt: r.updatedAt,
    });
  }, [opened.data, procedureId, setValue]);
  const [key] = useState(() => crypto.randomUUID());
  const listed = procedures.data?.procedures ?? [];
  // The freshest copy when listed (a re-approval moves its revision), else the one chosen.
  const procedure =
    listed.find((p) => p.id === procedureId) ?? (chosen?.id === procedureId ? chosen : undefined);
  const options = procedure && !listed.some((p) => p.id === procedure.id) ? [procedure, ...listed] : listed;
  const many = !!procedures.data && (procedures.data.total > procedures.data.procedures.length || !!q);
  const params = useRevisionParams(procedure?.approved?.id);
  const eligibility = useEligibility(procedure?.approved?.id ?? '').data?.eligibility;
  const fromPaper = form.watch('fromPaper');
  const submit = form.handleSubmit(
    ({ unitId, mainsVoltage, mainsFrequency, witnessId, instrumentId, ...paper }) => {
      if (eligibility?.refusal && !witnessId)
        return form.setError('witnessId', { message: 'name a qualified witness who will co-sign the run' });
      // Left empty, the frequency is the procedure's own.
      const frequency = mainsFrequency ?? params.data?.mainsFrequency;
      if (!procedure?.approved) return form.setError('procedureId', { message: 'Choose a procedure' });
      if (frequency === undefined)
        return form.setError('mainsFrequency', { message: 'Enter the mains frequency' });
      start.mutate(
        {
          revisionId: procedure.approved.id,
          unitId,
          mainsVoltage,
          mainsFrequency: frequency,
          key,
          ...(eligibility?.refusal && witnessId && { witnessId }),
          ...(instrumentId && { instrumentId }),
          ...(paper.fromPaper && { paperSheet: paperSheetOf(paper) }),
        },
        {
          onSuccess: (data) => {
            if (instrumentId) localStorage.setItem(USUAL, instrumentId);
            navigate(runPath(data.run.id));
          },
          onError: (e) => showServerError(form, e, { revisionId: 'procedureId', ...PAPER_SHEET_RENAME }),
        },
      );
    },
  );

  return (
    <form
      onSubmit={submit}
      className="flex max-w-2xl flex-col gap-4 rounded-lg border border-rule bg-card p-5"
      noValidate
    >
      <FormProblem formState={form.formState}>
        {start.error?.body.code === 'acknowledgement-required' &&
          typeof start.error.body.acknowledgeUrl === 'string' && (
            <>
              {' '}
              <Link className="font-semibold underline" to={start.error.body.acknowledgeUrl}>
                Read what changed and acknowledge it
              </Link>
            </>
          )}
      </FormProblem>
      {opened.data && opened.data.revision.state !== 'approved' && (
        <Notice>
          Revision {opened.data.revision.number} of “{opened.data.revision.title}” is{' '}
          {opened.data.revision.state.replace('_', ' ')}, not approved: choose the approved procedure below.
        </Notice>
      )}
      {many && (
        <label className="flex flex-col gap-1 text-sm font-semibold">
          Find an approved procedure by title
          <input
            type="search"
            placeholder="Words in the title…"
            className={`${select} font-normal`}
            value={find}
            onChange={(e) => setFind(e.target.value)}
            maxLength={160}
          />
        </label>
      )}
      <label className="flex flex-col gap-1 text-sm font-semibold">
        Approved procedure
        <select
          aria-label="Approved procedure"
          className={select}
          {...form.register('procedureId', {
            onChange: (e: React.ChangeEvent<HTMLSelectElement>) =>
              setChosen(options.find((p) => p.id === e.target.value)),
          })}
          // Controlled as well: a procedure chosen from the address gets its option a render after
          // its value is set, and the select must show it then.
          value={procedureId}
        >
          <option value="">Choose…</option>
          {options.map((p) => (
            <option key={p.id} value={p.id}>
              {p.title} ({p.equipmentModel}, revision {p.approved!.number})
            </option>
          ))}
        </select>
        {procedures.data && procedures.data.total > procedures.data.procedures.length && (
          <span className="font-normal text-graphite-soft">
            Showing the first {procedures.data.procedures.length} of {procedures.data.total} approved
            procedures{q ? ` whose title contains “${q}”` : ''}, by title; type more of the title to narrow.
          </span>
        )}
        {q && procedures.data?.total === 0 && (
          <span className="font-normal text-graphite-soft">
            No approved procedure’s title contains “{q}”.
          </span>
        )}
        {errors.procedureId && (
          <span role="alert" className="text-out">
            {errors.procedureId.message}
          </span>
        )}
      </label>
      <label className="flex flex-col gap-1 text-sm font-semibold">
        Unit on the bench
        <select aria-label="Unit on the bench" className={select} {...form.register('unitId')}>
          <option value="">Choose…</option>
          {units.map((u) => (
            <option key={u.id} value={u.id}>
              {u.model} · {u.serial}
              {u.jobNumber ? ` · job ${u.jobNumber}` : ''}
              {u.owner ? ` · ${u.owner}` : ''}
            </option>
          ))}
        </select>
        {errors.unitId && (
          <span role="alert" className="text-out">
            {errors.unitId.message}
          </span>
        )}
      </label>
      {eligibility?.refusal && (
        <div data-not-qualified className="flex flex-col gap-2 rounded-md border border-out bg-out-wash p-3">
          <p className="text-sm font-semibold text-out">{eligibility.refusal}</p>
          <label className="flex flex-col gap-1 text-sm font-semibold">
            Witness
            <select aria-label="Witness" className={select} {...form.register('witnessId')}>
              <option value="">Choose a qualified witness…</option>
              {eligibility.witnesses.map((w) => (
                <option key={w.id} value={w.id}>
                  {w.displayName}
                </option>
              ))}
            </select>
            <span className="font-normal text-graphite-soft">
              They watch the run and co-sign it as witnessed before you sign.
              {eligibility.witnesses.length === 0 && ' Nobody else is qualified for it yet: ask a reviewer.'}
            </span>
            {errors.witnessId && (
              <span role="alert" className="text-out">
                {errors.witnessId.message}
              </span>
            )}
          </label>
        </div>
      )}
      <label className="flex flex-col gap-1 text-sm font-semibold">
        Usual instrument for this run
        <select
          aria-label="Usual instrument for this run"
          className={select}
          {...form.register('instrumentId')}
        >
          <option value="">None recorded</option>
          {instruments.data?.instruments.map((i) => (
            <option key={i.id} value={i.id} disabled={!!i.refusal}>
              {i.identifier} · {INSTRUMENT_KINDS[i.kind]} · due {i.calibrationDue}
              {i.refusal ? ` — cannot be chosen: past its calibration due date` : ''}
            </option>
          ))}
        </select>
        <span className="font-normal text-graphite-soft">
          It takes every reading unless you choose another for one.
        </span>
        {errors.instrumentId && (
          <span role="alert" className="text-out">
            {errors.instrumentId.message}
          </span>
        )}
      </label>
      <div className="grid grid-cols-1 gap-4 sm:grid-cols-2">
        <label className="flex flex-col gap-1 text-sm font-semibold">
          Measured mains (V)
          <input
            className="value min-h-12 rounded-md border border-rule bg-paper px-3 text-xl"
            aria-label="Measured mains (V)"
            {...form.register('mainsVoltage')}
            placeholder={params.data ? `nominal ${params.data.mainsNominal} V` : 'e.g. 236 V'}
            autoComplete="off"
          />
          <span className="font-normal text-graphite-soft">
            Measure it at the bench outlet: every expected value is worked out again at this mains.
          </span>
          {errors.mainsVoltage && (
            <span role="alert" className="text-out">
              {errors.mainsVoltage.message}
            </span>
          )}
        </label>
        <label className="flex flex-col gap-1 text-sm font-semibold">
          Mains frequency (Hz)
          <input
            className="value min-h-12 rounded-md border border-rule bg-paper px-3 text-xl"
            aria-label="Mains frequency (Hz)"
            {...form.register('mainsFrequency')}
            placeholder={params.data ? String(params.data.mainsFrequency) : '50'}
            autoComplete="off"
          />
          {errors.mainsFrequency && (
            <span role="alert" className="text-out">
              {errors.mainsFrequency.message}
            </span>
          )}
        </label>
      </div>
      <div className="flex flex-col gap-3 rounded-md border border-rule p-3">
        <label className="flex min-h-11 items-center gap-3 text-sm font-semibold">
          <input type="checkbox" className="size-5" {...form.register('fromPaper')} />
          The readings are copied from a paper bench sheet
        </label>
        {fromPaper && (
          <>
            <p className="text-sm text-graphite-soft">
              Enter the mains the sheet was printed for above; each entry keeps the sheet’s date as the day it
              was taken, and the run sheet says so.
            </p>
            <PaperSheetFields form={form} />
          </>
        )}
      </div>
      <button
        type="submit"
        disabled={start.isPending}
        className="min-h-12 self-start rounded-md border border-accent-deep bg-accent px-5 text-base font-semibold text-white disabled:opacity-50"
      >
        {start.isPending ? 'Starting…' : 'Start the bench run'}
      </button>
    </form>
  );
}
