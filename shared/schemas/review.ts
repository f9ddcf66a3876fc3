/** Review and sign-off: request bodies (zod) and what the review API returns. */
import { z } from 'zod';
import { PASSWORD_MAX } from './limits';
import type { BlockView } from '../document/block-view';
import type { RevisionStateName } from './procedures';

/** The password is checked, never trimmed or length-limited below what sign-in accepts. */
const password = z
  .string({ error: 'Enter your password to sign' })
  .min(1, 'Enter your password to sign')
  .max(PASSWORD_MAX)
  .meta({ title: 'Your password' });
const comment = z.string().trim().max(4000).meta({ title: 'Comment' });

/** Why the revision was made: shown in the review, the history, the diff and on every run sheet from it. */
export const CHANGE_REASON_MAX = 500;
export const changeReason = z.string().trim().min(1).max(CHANGE_REASON_MAX).meta({ title: 'Change reason' });
export const submitBody = z
  .object({
    changeReason,
    lockVersion: z.number().int().min(1).meta({ title: 'Version of the draft' }).optional(),
  })
  .strict();
export const approveBody = z.object({ password, comment: comment.default('') }).strict();
export const returnBody = z
  .object({ password, comment: comment.min(1, 'Say what needs to change') })
  .strict();
export const withdrawBody = z
  .object({
    password,
    reason: comment
      .min(3, 'Give the reason for withdrawing (at least 3 characters)')
      .meta({ title: 'Reason for withdrawing' }),
  })
  .strict();
export const commentBody = z
  .object({
    body: z.string().trim().min(1, 'Write a comment').max(4000).meta({ title: 'Comment' }),
    blockId: z.string().min(1).max(64).nullable().meta({ title: 'Comment on' }).optional(),
  })
  .strict();

export type SignatureMeaningName = 'approved' | 'returned' | 'withdrawn';

export interface SignatureView {
  id: string;
  revisionId: string;
  revisionNumber: number;
  meaning: SignatureMeaningName;
  signer: { id: string; displayName: string; role: string };
  comment: string;
  signedAt: string;
  contentHash: string;
  /** Recomputed from the stored revision on this read. */
  verified: boolean;
}

export interface ReviewCommentView {
  id: string;
  revisionId: string;
  blockId: string | null;
  /** What the block is, for showing beside the comment ("Reading “B+2 at V1 anode”"). */
  blockLabel: string | null;
  author: { id: string; displayName: string };
  body: string;
  createdAt: string;
}

export interface QueueItem {
  revisionId: string;
  procedureId: string;
  title: string;
  equipmentModel: string;
  number: number;
  author: { id: string; displayName: string };
  submittedAt: string;
  ageSeconds: number;
  /** The caller wrote or edited it, so they may not decide on it. */
  ownWork: boolean;
}

export interface DiffPart {
  op: 'same' | 'add' | 'del';
  text: string;
}
export interface DiffLine {
  kind: 'same' | 'added' | 'removed' | 'changed';
  parts: DiffPart[];
}
export interface ValueChange {
  /** 'block': the block itself was renamed, added or removed (label says which). */
  kind: 'input' | 'output' | 'reading' | 'parameter' | 'block';
  /** Block name (its current one), reading label, or "Parameters". */
  subject: string;
  /** In the registry's words: the input's or output's label, "expected", "tolerance", "band", a parameter's label, or for a block "name". */
  label: string;
  before: string | null;
  after: string | null;
  /** The reckoner block's stable id, followed across renames. */
  blockId?: string;
  /** The reckoner's label ("Mains fuse"). */
  blockLabel?: string;
  /** On the one 'block' row of a renamed block: its name in the compared revision. */
  renamedFrom?: string;
  /** Where an input's value came from, in plain words, before and after. */
  sourceBefore?: string | null;
  sourceAfter?: string | null;
}

export interface BlockRef {
  id: string;
  label: string;
}

export interface ReviewView {
  revision: {
    id: string;
    procedureId: string;
    number: number;
    state: RevisionStateName;
    lockVersion: number;
    title: string;
    equipmentFamily: string;
    equipmentModel: string;
    author: { id: string; displayName: string };
    editors: { id: string; displayName: string }[];
    submittedAt: string | null;
    decidedAt: string | null;
    html: string;
    /** Why it was made, as given at submission ('' for a revision from before reasons were asked). */
    changeReason: string;
  };
  /** The approved revision this one is compared with; null for a first revision. */
  base: { id: string; number: number; state: RevisionStateName } | null;
  textDiff: DiffLine[];
  /** Against `base`; for a first revision, what it assumes and what follows, every row new. */
  valueChanges: ValueChange[];
  /** Every reckoner block of this revision: inputs with their sources beside the outputs. */
  reckoners: BlockView[];
  blocks: BlockRef[];
  comments: ReviewCommentView[];
  signatures: SignatureView[];
  /** Whether the caller may approve or return it now, and if not, why. */
  canDecide: boolean;
  cannotDecideReason: string | null;
}

export interface AuditEntryView {
  id: number;
  at: string;
  action: string;
  actor: { id: string; displayName: string } | null;
  subject: string | null;
  details: Record<string, unknown>;
  ip: string | null;
}

export interface OutboxItemView {
  id: string;
  to: string[];
  subject: string;
  reason: string;
  createdAt: string;
  status: 'sent' | 'pending';
  sentAt: string | null;
  attempts: number;
  lastError: string | null;
  nextAttemptAt: string;
  text: string;
}
