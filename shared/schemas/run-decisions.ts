/** Hold points reached out of band, and steps recorded as not applicable or as a deviation. */
import { z } from 'zod';

type Person = { id: string; displayName: string };

const words = (title: string, what: string) =>
  z
    .string({ error: `Give ${what}` })
    .trim()
    .min(3, `Give ${what} (at least 3 characters)`)
    .max(500, 'At most 500 characters')
    .meta({ title });

/** Who decides on holds and deviations: a reviewer or an admin who is not on the run. */
export const SENIOR_ROLES = ['reviewer', 'admin'] as const;
export const SENIOR_WORDS = 'a reviewer or an admin who is not performing the run';

export const holdDecisionBody = z
  .object({
    decision: z.enum(['continue', 'abandon'], 'Choose continue or abandon').meta({ title: 'Decision' }),
    reason: words('Reason for the decision', 'the reason for the decision'),
  })
  .strict();
export type HoldDecisionBody = z.infer<typeof holdDecisionBody>;

export const STEP_EXCEPTION_WORDS = {
  not_applicable: 'Not applicable',
  deviation: 'Deviation',
} as const;

export const stepExceptionBody = z
  .object({
    stepId: z.string().min(1).max(40).meta({ title: 'Step' }),
    kind: z
      .enum(['not_applicable', 'deviation'], 'Choose not applicable or deviation')
      .meta({ title: 'Kind of record' }),
    /** Not applicable: why. Deviation: what was done instead, and why. */
    reason: words('Reason, or what was done instead', 'the reason, or what was done instead'),
  })
  .strict();
export type StepExceptionBody = z.infer<typeof stepExceptionBody>;

export const deviationDecisionBody = z
  .object({
    decision: z.enum(['approved', 'refused'], 'Choose approve or refuse').meta({ title: 'Decision' }),
    note: words('Note on the decision', 'a note on the decision'),
  })
  .strict();
export type DeviationDecisionBody = z.infer<typeof deviationDecisionBody>;

export interface RunHoldPointView {
  id: string;
  stepId: string;
  position: number;
  text: string;
  raw: string;
  measured: number;
  unit: string;
  low: number | null;
  high: number | null;
  openedBy: Person;
  openedAt: string;
  decision: 'continue' | 'abandon' | null;
  reason: string | null;
  decidedBy: Person | null;
  decidedAt: string | null;
}

export interface RunStepExceptionView {
  id: string;
  stepId: string;
  position: number;
  text: string;
  kind: 'not_applicable' | 'deviation';
  reason: string;
  recordedBy: Person;
  recordedAt: string;
  decision: 'approved' | 'refused' | null;
  decisionNote: string | null;
  decidedBy: Person | null;
  decidedAt: string | null;
  /** The latest record for its step: the one that counts. */
  current: boolean;
}

/** A hold or a deviation waiting for a senior, for their list. */
export interface AwaitingDecision {
  kind: 'hold' | 'deviation';
  id: string;
  runId: string;
  runTitle: string;
  unit: { model: string; serial: string };
  performedBy: Person;
  step: { id: string; position: number; text: string };
  /** The reading that stopped the run, or what the technician recorded. */
  detail: string;
  since: string;
}
