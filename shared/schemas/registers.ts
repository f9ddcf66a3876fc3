// The shop's registers of test instruments and of qualifications: request schemas and views.
import { z } from 'zod';
import { oneLine } from './text';

/** The kinds of test instrument the register keeps, with their words. */
export const INSTRUMENT_KINDS = {
  meter: 'Meter',
  oscilloscope: 'Oscilloscope',
  'variac-meter': 'Variac with meter',
  'insulation-tester': 'Insulation tester',
} as const;
export type InstrumentKind = keyof typeof INSTRUMENT_KINDS;

const isoDate = z
  .string()
  .regex(/^\d{4}-\d{2}-\d{2}$/, 'must be a date written as YYYY-MM-DD')
  .refine(
    (s) =>
      !Number.isNaN(Date.parse(`${s}T00:00:00Z`)) && new Date(`${s}T00:00:00Z`).toISOString().startsWith(s),
    'must be a calendar date',
  )
  .meta({ title: 'Calibration due' });

export const instrumentBody = z
  .object({
    identifier: oneLine(40, { min: 1, label: 'Identifier' }),
    kind: z
      .enum(Object.keys(INSTRUMENT_KINDS) as [InstrumentKind, ...InstrumentKind[]])
      .meta({ title: 'Kind' }),
    description: oneLine(120, { label: 'Description' }).default(''),
    calibrationDue: isoDate,
  })
  .strict();
export type InstrumentBody = z.input<typeof instrumentBody>;
export const updateInstrumentBody = instrumentBody
  .extend({ lockVersion: z.number().int().min(1).meta({ title: 'Version' }) })
  .strict();

export interface InstrumentView {
  id: string;
  identifier: string;
  kind: InstrumentKind;
  description: string;
  calibrationDue: string;
  /** Past its calibration due date: it cannot be chosen for a reading, for this reason. */
  refusal: string | null;
  certificate: { url: string; fileName: string } | null;
  lockVersion: number;
}

/** Why an instrument cannot take a reading, or null; `today` is the server's date (YYYY-MM-DD). */
export const instrumentRefusal = (i: { identifier: string; calibrationDue: string }, today: string) =>
  i.calibrationDue < today
    ? `${i.identifier} was due for calibration on ${i.calibrationDue}; it cannot take readings until it is calibrated again`
    : null;

/**
 * What a qualification allows: running the procedures of one equipment family (as each procedure
 * states it), or live work. A bench run is live work when its revision carries a hazard note — the
 * procedure check requires one wherever more than 60 V DC or stored charge is involved.
 */
export const QUALIFICATION_SCOPES = { family: 'Procedure family', live: 'Live work' } as const;
export type QualificationScope = keyof typeof QUALIFICATION_SCOPES;

export const grantBody = z
  .object({
    personId: z.uuid().meta({ title: 'Technician' }),
    scope: z.enum(['family', 'live']).meta({ title: 'What is granted' }),
    /** The procedure family, as procedures state it; only for a family qualification. */
    family: oneLine(80, { label: 'Procedure family' }).default(''),
    note: oneLine(200, { label: 'Note' }).default(''),
  })
  .strict()
  .superRefine((b, ctx) => {
    if (b.scope === 'family' && !b.family)
      ctx.addIssue({ code: 'custom', path: ['family'], message: 'Choose the procedure family.' });
    if (b.scope === 'live' && b.family)
      ctx.addIssue({
        code: 'custom',
        path: ['family'],
        message: 'Live work is not for one family; leave the procedure family empty.',
      });
  });
export type GrantBody = z.input<typeof grantBody>;

export const withdrawBody = z
  .object({
    reason: z.string().trim().min(3).max(500).meta({ title: 'Reason for withdrawing' }),
  })
  .strict();

export interface QualificationView {
  id: string;
  person: { id: string; displayName: string };
  scope: QualificationScope;
  family: string | null;
  note: string;
  grantedBy: { id: string; displayName: string };
  grantedAt: string;
  withdrawn: { by: { id: string; displayName: string }; at: string; reason: string } | null;
}

/** What the start-run form learns before a run is started: may this person run it alone, and who could witness. */
export interface Eligibility {
  family: string;
  liveWork: boolean;
  /** Null when the person is qualified; otherwise the reason, in words. */
  refusal: string | null;
  witnesses: { id: string; displayName: string }[];
}
