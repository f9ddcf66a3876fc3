import { and, desc, eq, inArray, sql } from 'drizzle-orm';
import { evaluateDocument } from '../../../shared/document/evaluate';
import { lintProcedure } from '../../../shared/document/lint';
import { defaultParams, type ProcedureParams } from '../../../shared/document/params';
import { emptyDoc, type ProcedureDoc } from '../../../shared/document/schema';
import { plainText } from '../../../shared/document/extract';
import type { ProcedureListItem, RevisionView } from '../../../shared/schemas/procedures';
import type { Db } from '../../db/client';
import { people, procedures, revisions, type RevisionState } from '../../db/schema';
import type { SessionUser } from '../../http/route';
import { renderRevisionHtml } from './render-html';

type RevisionRow = typeof revisions.$inferSelect;
type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];

/** States a technician-only person may read: what has been approved, now or before. */
const PUBLISHED: RevisionState[] = ['approved', 'superseded'];

/** Only technicians are limited to published revisions; authors, reviewers and admins see all. */
export const seesDrafts = (user: SessionUser) => user.roles.some((r) => r !== 'technician');

/** Everything the server derives from a document: snapshot, sanitized HTML, plain text. */
export function derive(doc: ProcedureDoc, params: ProcedureParams) {
  const snapshot = evaluateDocument(doc, params);
  return { snapshot, html: renderRevisionHtml(doc, snapshot), plainText: plainText(doc) };
}

export async function revisionView(db: Db | Tx, row: RevisionRow): Promise<RevisionView> {
  const [author] = await db.select({ id: people.id, displayName: people.displayName }).from(people).where(eq(people.id, row.authorId));
  return {
    id: row.id,
    procedureId: row.procedureId,
    number: row.number,
    state: row.state,
    title: row.title,
    equipmentFamily: row.equipmentFamily,
    equipmentModel: row.equipmentModel,
    tags: row.tags,
    document: row.document,
    params: row.params,
    snapshot: row.snapshot,
    html: row.html,
    author: author ?? { id: row.authorId, displayName: 'unknown' },
    lockVersion: row.lockVersion,
    createdAt: row.createdAt.toISOString(),
    updatedAt: row.updatedAt.toISOString(),
    submittedAt: row.submittedAt?.toISOString() ?? null,
    decidedAt: row.decidedAt?.toISOString() ?? null,
    lint: lintProcedure(row.document, row.snapshot),
  };
}

export interface NewProcedure {
  title: string;
  equipmentFamily: string;
  equipmentModel: string;
  tags: string[];
  params?: ProcedureParams;
  document?: ProcedureDoc;
  seedKey?: string;
}

/** Creates a procedure with revision 1 as a draft (or in the given state, for demo content). */
export async function createProcedure(db: Db | Tx, authorId: string, input: NewProcedure, state: RevisionState = 'draft') {
  const params = input.params ?? defaultParams();
  const document = input.document ?? emptyDoc();
  const [procedure] = await db
    .insert(procedures)
    .values({ title: input.title, equipmentFamily: input.equipmentFamily, equipmentModel: input.equipmentModel, tags: input.tags, ownerId: authorId, seedKey: input.seedKey })
    .returning();
  const [revision] = await db
    .insert(revisions)
    .values({
      procedureId: procedure!.id,
      number: 1,
      state,
      title: input.title,
      equipmentFamily: input.equipmentFamily,
      equipmentModel: input.equipmentModel,
      tags: input.tags,
      document,
      params,
      ...derive(document, params),
      authorId,
      editorIds: [authorId],
      decidedAt: state === 'approved' ? new Date() : null,
    })
    .returning();
  return { procedure: procedure!, revision: revision! };
}

export async function listProcedures(db: Db, user: SessionUser): Promise<ProcedureListItem[]> {
  const visible = seesDrafts(user) ? undefined : inArray(revisions.state, PUBLISHED);
  // Only the listing columns: documents and snapshots stay in the database.
  const rows = await db
    .select({
      p: { id: procedures.id },
      r: {
        id: revisions.id,
        number: revisions.number,
        state: revisions.state,
        title: revisions.title,
        equipmentFamily: revisions.equipmentFamily,
        equipmentModel: revisions.equipmentModel,
        tags: revisions.tags,
        updatedAt: revisions.updatedAt,
      },
      owner: { id: people.id, displayName: people.displayName },
    })
    .from(procedures)
    .innerJoin(revisions, eq(revisions.procedureId, procedures.id))
    .innerJoin(people, eq(people.id, procedures.ownerId))
    .where(visible)
    .orderBy(desc(revisions.number));
  const byProcedure = new Map<string, ProcedureListItem>();
  for (const { p, r, owner } of rows) {
    let item = byProcedure.get(p.id);
    if (!item) {
      item = {
        id: p.id,
        title: r.title,
        equipmentFamily: r.equipmentFamily,
        equipmentModel: r.equipmentModel,
        tags: r.tags,
        owner,
        latest: { id: r.id, number: r.number, state: r.state, updatedAt: r.updatedAt.toISOString() },
        approved: null,
        updatedAt: r.updatedAt.toISOString(),
      };
      byProcedure.set(p.id, item);
    }
    if (r.state === 'approved') item.approved = { id: r.id, number: r.number };
  }
  return [...byProcedure.values()].sort((a, b) => a.title.localeCompare(b.title));
}

export async function getRevisionRow(db: Db | Tx, id: string) {
  const [row] = await db.select().from(revisions).where(eq(revisions.id, id));
  return row;
}

export async function latestApproved(db: Db | Tx, procedureId: string) {
  const [row] = await db
    .select()
    .from(revisions)
    .where(and(eq(revisions.procedureId, procedureId), eq(revisions.state, 'approved')));
  return row;
}

export async function latestInState(db: Db | Tx, procedureId: string, state: RevisionState) {
  const [row] = await db
    .select()
    .from(revisions)
    .where(and(eq(revisions.procedureId, procedureId), eq(revisions.state, state)))
    .orderBy(desc(revisions.number))
    .limit(1);
  return row;
}

export async function nextRevisionNumber(db: Db | Tx, procedureId: string) {
  const [row] = await db
    .select({ n: sql<number>`coalesce(max(${revisions.number}), 0) + 1` })
    .from(revisions)
    .where(eq(revisions.procedureId, procedureId));
  return Number(row!.n);
}
