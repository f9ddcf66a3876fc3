import { z } from 'zod';
import type { Snapshot } from '../document/evaluate';
import type { ProcedureParams } from '../document/params';
import { paramsSchema } from '../document/params';
import type { ProcedureDoc } from '../document/schema';
import type { LintWarning } from '../document/lint';

import type { RevisionStateName } from './revision-states';

export { REVISION_STATE_LABELS, type RevisionStateName } from './revision-states';

const tag = z
  .string()
  .trim()
  .min(1, 'empty tag')
  .max(40, 'tags are at most 40 characters')
  .transform((t) => t.toLowerCase());

export const procedureMetaSchema = z.object({
  title: z.string().trim().min(3, 'at least 3 characters').max(160, 'at most 160 characters'),
  equipmentFamily: z.string().trim().min(1, 'required').max(80, 'at most 80 characters'),
  equipmentModel: z.string().trim().min(1, 'required').max(80, 'at most 80 characters'),
  tags: z.array(tag).max(20, 'at most 20 tags').transform((t) => [...new Set(t)]),
});

export const createProcedureBody = procedureMetaSchema.extend({ params: paramsSchema.optional() }).strict();

/** A draft save: the lock version it was based on, metadata, parameters and the TipTap document. */
export const saveRevisionBody = procedureMetaSchema
  .extend({
    lockVersion: z.number().int().min(1),
    params: paramsSchema,
    /** Checked node by node by validateDocument on the server. */
    document: z.unknown(),
  })
  .strict();

export type CreateProcedureBody = z.infer<typeof createProcedureBody>;
export type SaveRevisionBody = z.input<typeof saveRevisionBody>;

export interface RevisionView {
  id: string;
  procedureId: string;
  number: number;
  state: RevisionStateName;
  title: string;
  equipmentFamily: string;
  equipmentModel: string;
  tags: string[];
  document: ProcedureDoc;
  params: ProcedureParams;
  snapshot: Snapshot;
  html: string;
  author: { id: string; displayName: string };
  lockVersion: number;
  createdAt: string;
  updatedAt: string;
  submittedAt: string | null;
  decidedAt: string | null;
  lint: LintWarning[];
}

export interface ProcedureListItem {
  id: string;
  title: string;
  equipmentFamily: string;
  equipmentModel: string;
  tags: string[];
  owner: { id: string; displayName: string };
  /** The newest revision the caller may see. */
  latest: { id: string; number: number; state: RevisionStateName; updatedAt: string };
  approved: { id: string; number: number } | null;
  updatedAt: string;
}

export interface AttachmentView {
  id: string;
  fileName: string;
  mediaType: 'image/png' | 'image/jpeg' | 'image/webp' | 'application/pdf';
  size: number;
  url: string;
}
