/** Read before you run: a technician's acknowledgement of a newly approved revision (request and answers). */
import { z } from 'zod';
import type { DiffLine, ValueChange } from './review';

/** The content hash the technician was shown: they acknowledge exactly what they read. */
export const acknowledgeBody = z
  .object({
    contentHash: z
      .string({ error: 'Content hash is required' })
      .regex(/^[0-9a-f]{64}$/, 'Content hash: the revision’s SHA-256 as shown (64 hex digits)'),
  })
  .strict();

export interface AcknowledgementRecord {
  person: { id: string; displayName: string };
  acknowledgedAt: string;
  contentHash: string;
}

/** What the acknowledgement screen shows the caller, and whether they still have to acknowledge. */
export interface AcknowledgementView {
  revision: {
    id: string;
    procedureId: string;
    number: number;
    title: string;
    equipmentModel: string;
    changeReason: string;
    contentHash: string;
  };
  /** The caller ran an earlier revision of this procedure and has not yet acknowledged or run this one. */
  required: boolean;
  acknowledgement: AcknowledgementRecord | null;
  base: { id: string; number: number } | null;
  textDiff: DiffLine[];
  valueChanges: ValueChange[];
}

/** Per approved revision, for reviewers: everyone who must acknowledge it, and who has. */
export interface AcknowledgementStatus {
  revisionId: string;
  number: number;
  people: { id: string; displayName: string; acknowledgedAt: string | null; contentHash: string | null }[];
}
