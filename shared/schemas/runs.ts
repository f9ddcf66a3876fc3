import type { SignalLevel } from '../safety-signs';
import { z } from 'zod';
import type { Snapshot } from '../document/evaluate';
import type { ProcedureParams } from '../document/params';
import { PARAM_SPECS } from '../document/params';
import type { CheckKind } from '../document/schema';
import type { Measure } from '../reckoners/types';
import { paperSheetInput } from './paper-sheets';
import type { FollowUpView, RunReleaseView } from './follow-ups';
import type { RunHoldPointView, RunStepExceptionView } from './run-decisions';

export type RunStepKind = 'reading' | 'check' | 'hazard';

/** One step of a bench run, in document order, with everything the bench needs to show and check it. */
export interface RunStep {
  id: string;
  kind: RunStepKind;
  /** 1-based position among the run's steps. */
  position: number;
  section: string;
  /** Reading label, check-step text, or the hazard note's text. */
  text: string;
  reading?: {
    testPoint: string;
    meterRange: string;
    unit: string;
    /** rms, peak, peak-to-peak or dc, for volts and amps (absent on runs started before it was recorded). */
    measure?: Measure;
    toleranceText: string;
    expectedSource: string;
    expected: number | null;
    low: number | null;
    high: number | null;
    bandText: string | null;
    error?: string;
  };
  hazard?: {
    level: SignalLevel;
    /** The live-work cautions the note states, in words (absent on runs started before notes carried them). */
    flags?: string[];
  };
  /** A check step that is more than a confirmation, or done live: its heading ("Wait 10 s for the bleeder"). */
  check?: { kind: CheckKind; heading: string; threshold?: string; seconds?: number };
  /** Done or measured on a powered unit. */
  live?: boolean;
  /** A reading marked as a hold point: out of band, the run stops until a senior decides. */
  holdPoint?: boolean;
}

const spec = (key: 'mainsVoltage' | 'mainsFrequency') => PARAM_SPECS.find((p) => p.key === key)!;
const bounded = (key: 'mainsVoltage' | 'mainsFrequency') => {
  const p = spec(key);
  return z
    .number({ error: `${p.label} must be a number in ${p.unit}` })
    .refine(Number.isFinite, 'must be a finite number')
    .pipe(
      z
        .number()
        .min(p.min, `${p.label} must be at least ${p.min} ${p.unit}`)
        .max(p.max, `${p.label} must be at most ${p.max} ${p.unit}`),
    )
    .meta({ title: p.label });
};

export const startRunBody = z
  .object({
    revisionId: z.uuid('Choose an approved procedure').meta({ title: 'Approved procedure' }),
    unitId: z.uuid('Choose the unit on the bench').meta({ title: 'Unit on the bench' }),
    mainsVoltage: bounded('mainsVoltage'),
    mainsFrequency: bounded('mainsFrequency'),
    /** Client-generated; the same key twice starts one run. */
    key: z.uuid().meta({ title: 'Request key' }).optional(),
    /** The qualified person who witnesses and co-signs a trainee's run. */
    witnessId: z.uuid().meta({ title: 'Witness' }).optional(),
    /** The bench's usual instrument: it takes every reading unless another is chosen for one. */
    instrumentId: z.uuid().meta({ title: 'Instrument' }).optional(),
    /** The readings are copied from a paper bench sheet: its date (and identifier). */
    paperSheet: paperSheetInput.optional(),
  })
  .strict();
export type StartRunBody = z.infer<typeof startRunBody>;

/**
 * One entry for one step. Strict: a client cannot send "within", "expected" or any other mark;
 * the server decides them with the shared checkReading.
 */
export const entryBody = z
  .object({
    key: z.uuid().meta({ title: 'Request key' }),
    /** A reading as typed ("352", "352 V", "0.35 kV"); a finite number is read in the reading's unit. */
    value: z
      .union([z.string().trim().min(1).max(40), z.number()], {
        error: 'Enter the measured value, such as "352 V"',
      })
      .meta({ title: 'Measured value' })
      .optional(),
    /** Check step ticked or hazard note acknowledged. */
    done: z.boolean().meta({ title: 'Done' }).optional(),
    note: z.string().max(2000).meta({ title: 'Note' }).optional(),
    /** Why a recorded measurement is being changed; required for a change. */
    reason: z.string().trim().max(500).meta({ title: 'Reason for the change' }).optional(),
    /** Who made the entry (their person id): the server refuses it from anyone else's session. */
    by: z.uuid().meta({ title: 'Entered by' }).optional(),
    /** The instrument that took a reading, when not the run's usual one. */
    instrumentId: z.uuid().meta({ title: 'Instrument' }).optional(),
  })
  .strict();
export type EntryBody = z.infer<typeof entryBody>;

const why = (what: string) =>
  z
    .string({ error: `Give the reason for ${what}` })
    .trim()
    .min(3, `Give the reason for ${what} (at least 3 characters)`)
    .max(500)
    .meta({ title: `Reason for ${what}` });

/** Hand an open run over to another technician, who performs (and signs) it from then on. */
export const handoverBody = z
  .object({
    to: z.uuid('Choose the technician who takes the run over').meta({ title: 'Technician' }),
    reason: why('the handover'),
  })
  .strict();
export type HandoverBody = z.infer<typeof handoverBody>;

/** Close an open run without signing it (the unit left, or the revision it follows was withdrawn). */
export const abandonBody = z.object({ reason: why('closing the run') }).strict();

export const signRunBody = z
  .object({
    password: z.string().min(1, 'Enter your password to sign').max(256).meta({ title: 'Your password' }),
    meaning: z.literal('performed').default('performed'),
    reason: z.string().trim().max(500).meta({ title: 'Reason' }).optional(),
  })
  .strict();

/** The witness co-signs a trainee's finished run ("witnessed") before the trainee signs it. */
export const witnessRunBody = z
  .object({ password: z.string().min(1, 'enter your password to sign as witness').max(256) })
  .strict();

export const runListQuery = z
  .object({
    status: z.enum(['in_progress', 'signed', 'abandoned'], 'not a run status').optional(),
    unitId: z.uuid().optional(),
    mine: z.enum(['1']).optional(),
  })
  .strict();

export interface EntryVersionView {
  version: number;
  raw: string | null;
  measured: number | null;
  within: boolean | null;
  done: boolean;
  note: string;
  reason: string | null;
  enteredBy: { id: string; displayName: string };
  enteredAt: string;
  /** Copied from a paper bench sheet dated this day (YYYY-MM-DD). */
  takenOn?: string | null;
}

export interface EntryView {
  stepId: string;
  kind: RunStepKind;
  raw: string | null;
  measured: number | null;
  unit: string | null;
  expected: number | null;
  low: number | null;
  high: number | null;
  within: boolean | null;
  deviation: number | null;
  deviationPercent: number | null;
  done: boolean;
  note: string;
  version: number;
  lastKey: string;
  enteredBy: { id: string; displayName: string };
  enteredAt: string;
  /** Earlier versions, oldest first (present when the entry was changed). */
  history: EntryVersionView[];
  /** The instrument that took the reading, with its calibration due date when it did. */
  instrument?: RunInstrument | null;
  /** Copied from a paper bench sheet dated this day (YYYY-MM-DD); enteredAt stays the server's time. */
  takenOn?: string | null;
}

export interface RunInstrument {
  id: string;
  identifier: string;
  kind: string;
  calibrationDue: string;
}

export interface RunPhotoView {
  id: string;
  stepId: string | null;
  url: string;
  addedBy: { id: string; displayName: string };
  addedAt: string;
}

export interface RunSignatureView {
  signer: { id: string; displayName: string };
  signerRole: string;
  meaning: 'performed';
  reason: string | null;
  signedAt: string;
  contentHash: string;
  /** Recomputed on every read: does the stored hash still match the run's content? */
  verified: boolean;
}

export interface RevisionRecord {
  id: string;
  number: number;
  state: string;
  title: string;
  approvedAt: string | null;
  author: { id: string; displayName: string };
  contentHash: string;
  /** Why the revision was made, as given when it was submitted ('' from before reasons were asked). */
  changeReason: string;
  /** Reviewer sign-offs on the revision, when the shop records them. */
  signOffs: { name: string; meaning: string; signedAt: string }[];
}

export type RunStatus = 'in_progress' | 'signed' | 'abandoned';
type Person = { id: string; displayName: string };

/** A run whose revision was withdrawn while it was open: nothing more can be recorded or signed. */
export interface RunHold {
  reason: string;
  /** Who withdrew the revision, as signed. */
  by: string;
  at: string;
  revisionNumber: number;
}

/** An open run whose revision a newer approved one replaced: it may continue, with the changes shown. */
export interface RunSupersession {
  /** The approved revision now current. */
  revisionId: string;
  number: number;
  /** Each approved revision since the run's, oldest first, with why it was made. */
  changes: { revisionId: string; number: number; changeReason: string }[];
}

export interface RunHandoverView {
  from: Person;
  to: Person;
  /** The performer who handed over, or an admin who reassigned the run. */
  by: Person;
  reason: string;
  at: string;
}

export interface RunView {
  id: string;
  title: string;
  status: RunStatus;
  outOfTolerance: boolean;
  unit: { id: string; model: string; serial: string; owner: string; jobNumber: string };
  revision: RevisionRecord;
  params: ProcedureParams;
  snapshot: Snapshot;
  steps: RunStep[];
  entries: EntryView[];
  photos: RunPhotoView[];
  signature: RunSignatureView | null;
  startedBy: { id: string; displayName: string };
  /** Who performs the run now: the only person who may record entries and sign. */
  performedBy: Person;
  handovers: RunHandoverView[];
  /** A trainee's run: the qualified witness, and their co-signature once given. */
  witness?: {
    person: Person;
    signature: { signedAt: string; contentHash: string; current: boolean } | null;
  } | null;
  /** The bench's usual instrument for this run. */
  defaultInstrument?: RunInstrument | null;
  /** Entries made now are copied from this paper bench sheet (its date, and identifier when given). */
  paperSheet?: { date: string; reference: string | null } | null;
  hold: RunHold | null;
  /** Hold points reached out of band on this run, decided or waiting for a senior. */
  holdPoints?: RunHoldPointView[];
  /** Steps recorded as not applicable or as a deviation, oldest first. */
  exceptions?: RunStepExceptionView[];
  superseded?: RunSupersession | null;
  /** Closed as abandoned. */
  closed: { by: Person; reason: string; at: string } | null;
  startedAt: string;
  signedAt: string | null;
  progress: { done: number; total: number; outOfTolerance: number };
  /** Step ids that cannot be entered yet: they follow a hazard note not yet acknowledged. */
  locked: string[];
  /** The second signature, "checked and released" (signed runs). */
  release?: RunReleaseView | null;
  /** The follow-up this run's out-of-band readings opened, and those it closed as a passing re-run. */
  followUp?: FollowUpView | null;
  closesFollowUps?: FollowUpView[];
}

export interface RunListItem {
  id: string;
  title: string;
  status: RunStatus;
  onHold: boolean;
  /** Stopped at a hold point, waiting for a senior's decision. */
  atHoldPoint?: boolean;
  outOfTolerance: boolean;
  revisionNumber: number;
  unit: { id: string; model: string; serial: string };
  startedBy: { id: string; displayName: string };
  performedBy: Person;
  startedAt: string;
  signedAt: string | null;
  progress: { done: number; total: number };
}
