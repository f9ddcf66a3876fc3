/** Release signatures, unit states and non-conformance follow-ups: bodies, words and views. */
import { z } from 'zod';

export const UNIT_STATES = ['on_bench', 'released', 'waiting_parts', 'returned'] as const;
export type UnitState = (typeof UNIT_STATES)[number];
export const UNIT_STATE_WORDS: Record<UnitState, string> = {
  on_bench: 'On the bench',
  released: 'Released',
  waiting_parts: 'Waiting for parts',
  returned: 'Returned',
};
/** The states a person sets by hand (with a reason); "released" only follows a release signature. */
export const SETTABLE_UNIT_STATES = ['on_bench', 'waiting_parts', 'returned'] as const;

export const DISPOSITIONS = ['repair', 'accept', 'return'] as const;
export type Disposition = (typeof DISPOSITIONS)[number];
export const DISPOSITION_WORDS: Record<Disposition, string> = {
  repair: 'Repair and re-run',
  accept: 'Accepted with a reason',
  return: 'Return unrepaired',
};

const reason = (what: string) =>
  z
    .string({ error: `Give the reason for ${what}` })
    .trim()
    .min(3, `Give the reason for ${what} (at least 3 characters)`)
    .max(500)
    .meta({ title: 'Reason' });

export const releaseRunBody = z
  .object({
    password: z
      .string()
      .min(1, 'Enter your password to sign the release')
      .max(256)
      .meta({ title: 'Your password' }),
  })
  .strict();

export const unitStateBody = z
  .object({
    state: z.enum(SETTABLE_UNIT_STATES, 'Choose on the bench, waiting for parts or returned').meta({
      title: 'State',
    }),
    reason: reason('the change'),
  })
  .strict();
export type UnitStateBody = z.infer<typeof unitStateBody>;

export const dispositionBody = z
  .object({
    disposition: z.enum(DISPOSITIONS, 'Choose repair and re-run, accept, or return unrepaired').meta({
      title: 'Disposition',
    }),
    /** Needed to accept or to return unrepaired; a note for repair. */
    reason: z.string().trim().max(500).meta({ title: 'Reason' }).optional(),
  })
  .strict()
  .superRefine((b, ctx) => {
    if (b.disposition !== 'repair' && (b.reason ?? '').length < 3)
      ctx.addIssue({
        code: 'custom',
        path: ['reason'],
        message:
          b.disposition === 'accept'
            ? 'Give the reason for accepting the readings (at least 3 characters).'
            : 'Give the reason for returning the unit unrepaired (at least 3 characters).',
      });
  });
export type DispositionBody = z.infer<typeof dispositionBody>;

export const ownerBody = z
  .object({ ownerId: z.uuid('Choose the new owner').meta({ title: 'Owner' }) })
  .strict();

export const followUpListQuery = z
  .object({ status: z.enum(['open', 'closed', 'all'], 'Choose open, closed or all').optional() })
  .strict();

type Person = { id: string; displayName: string };

export interface RunReleaseView {
  signer: Person;
  signerRole: string;
  meaning: 'released';
  signedAt: string;
  contentHash: string;
  /** The release covers the hash the performed signature covers. */
  matchesRun: boolean;
}

export interface FollowUpReading {
  entryId: string;
  stepId: string;
  label: string;
  raw: string | null;
  measured: number | null;
  unit: string | null;
  low: number | null;
  high: number | null;
  /** The band as the run sheet words it. */
  band: string | null;
}

export interface FollowUpView {
  id: string;
  run: { id: string; title: string; signedAt: string | null };
  unit: { id: string; model: string; serial: string };
  readings: FollowUpReading[];
  owner: Person;
  disposition: {
    value: Disposition;
    reason: string | null;
    by: Person;
    at: string;
  } | null;
  closed: {
    at: string;
    by: Person;
    /** Closed by this later in-band run, or else by the disposition. */
    run: { id: string; title: string; signedAt: string | null } | null;
  } | null;
  openedAt: string;
}

export interface UnitStateView {
  state: UnitState;
  reason: string | null;
  runId: string | null;
  by: Person;
  at: string;
}
