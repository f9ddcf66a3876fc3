import { z } from 'zod';
import type { BlockView } from '../document/block-view';
import type { Snapshot } from '../document/evaluate';
import type { ProcedureParams } from '../document/params';
import { paramsSchema } from '../document/params';
import type { ProcedureDoc } from '../document/schema';
import type { LintWarning } from '../document/lint';

import type { RevisionStateName } from './revision-states';
import { oneLine } from './text';

export { REVISION_STATE_LABELS, type RevisionStateName } from './revision-states';

const tag = oneLine(40, { min: 1, label: 'Tag' }).transform((t) => t.toLowerCase());

/** Labels are the form's (new procedure, draft details): refusals name fields by them. */
export const procedureMetaSchema = z.object({
  title: oneLine(160, { min: 3, label: 'Title' }),
  equipmentFamily: oneLine(80, { min: 1, label: 'Equipment family' }),
  equipmentModel: oneLine(80, { min: 1, label: 'Model' }),
  tags: z
    .array(tag)
    .max(20)
    .transform((t) => [...new Set(t)])
    .meta({ title: 'Tags' }),
});

export const createProcedureBody = procedureMetaSchema.extend({ params: paramsSchema.optional() }).strict();

/** A draft save: the lock version it was based on, metadata, parameters and the TipTap document. */
/** The next draft: from a named approved or returned revision of the procedure, else the approved one (or the latest returned). */
export const startDraftBody = z
  .object({ fromRevisionId: z.uuid('not a valid revision id').optional() })
  .strict();

export const saveRevisionBody = procedureMetaSchema
  .extend({
    lockVersion: z.number().int().min(1).meta({ title: 'Version of the draft' }),
    params: paramsSchema,
    /** Checked node by node by validateDocument on the server. */
    document: z.unknown().meta({ title: 'Procedure text' }),
  })
  .strict();

export type CreateProcedureBody = z.infer<typeof createProcedureBody>;
export type SaveRevisionBody = z.input<typeof saveRevisionBody>;

/** Columns the procedure list sorts by, on the server. */
export const PROCEDURE_SORTS = ['title', 'equipment', 'state', 'updatedAt'] as const;
export type ProcedureSort = (typeof PROCEDURE_SORTS)[number];
export const PROCEDURE_PAGE_SIZES = [25, 50, 100, 200] as const;

/** GET /api/procedures: filters, sort and one page; every field optional with a shop-sensible default. */
export const procedureListQuery = z.object({
  /** Words the title contains, in any case. */
  q: z.string().trim().max(160).meta({ title: 'Title words' }).optional(),
  family: z.string().max(80).meta({ title: 'Equipment family' }).optional(),
  tag: z.string().max(40, 'at most 40 characters').optional(),
  state: z
    .enum(['draft', 'in_review', 'approved', 'returned', 'superseded', 'withdrawn'], 'not a revision state')
    .optional(),
  /** Only procedures with an approved revision: what a bench run may follow. */
  runnable: z
    .enum(['true', 'false'], 'true or false')
    .optional()
    .transform((v) => v === 'true'),
  sort: z.enum(PROCEDURE_SORTS).meta({ title: 'Sort by' }).default('updatedAt'),
  dir: z.enum(['asc', 'desc']).meta({ title: 'Order' }).optional(),
  offset: z.coerce
    .number('a whole number')
    .int('a whole number')
    .min(0, 'at least 0')
    .max(1_000_000, 'at most 1,000,000')
    .default(0),
  limit: z.coerce
    .number('a whole number')
    .int('a whole number')
    .min(1, 'at least 1')
    .max(200, 'at most 200')
    .default(50),
});
export type ProcedureListQuery = z.input<typeof procedureListQuery>;

export interface ProcedurePage {
  procedures: ProcedureListItem[];
  /** How many procedures match the filters, over all pages. */
  total: number;
  offset: number;
  limit: number;
}

/** The values the list's filters offer: what occurs among the procedures the caller may see. */
export interface ProcedureFacets {
  families: string[];
  tags: string[];
  states: RevisionStateName[];
}

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
  /** Every reckoner block as the reader shows it: inputs with their sources beside the outputs, in the author's order. */
  reckoners: BlockView[];
  html: string;
  author: { id: string; displayName: string };
  lockVersion: number;
  createdAt: string;
  updatedAt: string;
  submittedAt: string | null;
  decidedAt: string | null;
  /** Why it was made, as given at submission ('' while a draft, or from before reasons were asked). */
  changeReason: string;
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
