import { sql } from 'drizzle-orm';
import {
  bigint,
  check,
  index,
  integer,
  jsonb,
  pgTable,
  primaryKey,
  text,
  timestamp,
  uniqueIndex,
  uuid,
} from 'drizzle-orm/pg-core';
import type { ProcedureParams } from '../../../shared/document/params';
import type { ProcedureDoc } from '../../../shared/document/schema';
import type { Snapshot } from '../../../shared/document/evaluate';
import { people } from './people';

export const REVISION_STATES = [
  'draft',
  'in_review',
  'approved',
  'returned',
  'superseded',
  'withdrawn',
] as const;
export type RevisionState = (typeof REVISION_STATES)[number];

/** A procedure's stable identity; title and equipment mirror its latest revision for listing. */
export const procedures = pgTable(
  'procedures',
  {
    id: uuid().primaryKey().defaultRandom(),
    title: text().notNull(),
    equipmentFamily: text().notNull(),
    equipmentModel: text().notNull(),
    tags: text()
      .array()
      .notNull()
      .default(sql`'{}'::text[]`),
    ownerId: uuid()
      .notNull()
      .references(() => people.id),
    /** Natural key for demo content, so seeding twice never duplicates. */
    seedKey: text().unique(),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('procedures_family_idx').on(t.equipmentFamily)],
);

/** One numbered version of a procedure. */
export const revisions = pgTable(
  'revisions',
  {
    id: uuid().primaryKey().defaultRandom(),
    procedureId: uuid()
      .notNull()
      .references(() => procedures.id, { onDelete: 'cascade' }),
    number: integer().notNull(),
    state: text().$type<RevisionState>().notNull().default('draft'),
    title: text().notNull(),
    equipmentFamily: text().notNull(),
    equipmentModel: text().notNull(),
    tags: text()
      .array()
      .notNull()
      .default(sql`'{}'::text[]`),
    document: jsonb().$type<ProcedureDoc>().notNull(),
    params: jsonb().$type<ProcedureParams>().notNull(),
    /** Evaluated by the server with the shared reckoners; the client's numbers are never stored. */
    snapshot: jsonb().$type<Snapshot>().notNull(),
    html: text().notNull(),
    plainText: text().notNull(),
    authorId: uuid()
      .notNull()
      .references(() => people.id),
    /** Everyone who saved this revision: none of them may approve it. */
    editorIds: uuid()
      .array()
      .notNull()
      .default(sql`'{}'::uuid[]`),
    /**
     * Authors and editors of every revision this one was started from (and of theirs): they count
     * as its authors for four eyes, so nobody approves their own words by way of a returned revision.
     */
    provenanceIds: uuid()
      .array()
      .notNull()
      .default(sql`'{}'::uuid[]`),
    lockVersion: integer().notNull().default(1),
    /** Why this revision was made, given when it is submitted; fixed from then on (drizzle/0021). */
    changeReason: text().notNull().default(''),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    submittedAt: timestamp({ withTimezone: true }),
    decidedAt: timestamp({ withTimezone: true }),
    /**
     * SHA-256 of the signed content (review/signed-content.ts), recorded in the UPDATE that approves
     * it; at commit the database wants the reviewer's signature over the same hash (drizzle/0015).
     */
    contentHash: text(),
  },
  (t) => [
    uniqueIndex('revisions_procedure_number_uq').on(t.procedureId, t.number),
    // At most one revision being worked on or reviewed per procedure at a time.
    uniqueIndex('revisions_one_open_uq')
      .on(t.procedureId)
      .where(sql`state in ('draft', 'in_review')`),
    uniqueIndex('revisions_one_approved_uq')
      .on(t.procedureId)
      .where(sql`state = 'approved'`),
    index('revisions_state_idx').on(t.state),
  ],
);

/** Who a listing row is for: staff see every state; technicians only what has been approved. */
export type ListingAudience = 'staff' | 'published';

/**
 * The procedure list's read model: per procedure and audience, the newest revision that audience
 * may see, and the approved one. Written only by the trigger on revisions (drizzle/0010), so it
 * changes in the same transaction as the revision and the list is one indexed query.
 */
export const procedureListing = pgTable(
  'procedure_listing',
  {
    procedureId: uuid()
      .notNull()
      .references(() => procedures.id, { onDelete: 'cascade' }),
    audience: text().$type<ListingAudience>().notNull(),
    revisionId: uuid().notNull(),
    number: integer().notNull(),
    state: text().$type<RevisionState>().notNull(),
    title: text().notNull(),
    equipmentFamily: text().notNull(),
    equipmentModel: text().notNull(),
    tags: text().array().notNull(),
    updatedAt: timestamp({ withTimezone: true }).notNull(),
    approvedId: uuid(),
    approvedNumber: integer(),
    ownerId: uuid().notNull(),
  },
  (t) => [
    primaryKey({ columns: [t.procedureId, t.audience] }),
    index('procedure_listing_updated_idx').on(t.audience, t.updatedAt, t.procedureId),
    index('procedure_listing_title_idx').on(t.audience, sql`lower(${t.title})`, t.procedureId),
  ],
);

/**
 * Uploaded photos, schematics and scope captures. Append-only (trigger and grants): the bytes are
 * found by their SHA-256 in the file store (server/storage), so a row can only ever name one content.
 */
export const attachments = pgTable(
  'attachments',
  {
    id: uuid().primaryKey().defaultRandom(),
    originalName: text().notNull(),
    mediaType: text().notNull(),
    size: bigint({ mode: 'number' }).notNull(),
    sha256: text().notNull(),
    uploadedBy: uuid()
      .notNull()
      .references(() => people.id),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [check('attachments_sha256_hex', sql`${t.sha256} ~ '^[0-9a-f]{64}$'`)],
);
