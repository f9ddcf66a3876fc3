import { and, asc, desc, eq, isNotNull, sql, type SQL } from 'drizzle-orm';
import type { z } from 'zod';
import { describeBlocks } from '../../../shared/document/block-view';
import { evaluateDocument } from '../../../shared/document/evaluate';
import { lintProcedure } from '../../../shared/document/lint';
import { defaultParams, type ProcedureParams } from '../../../shared/document/params';
import { emptyDoc, type ProcedureDoc } from '../../../shared/document/schema';
import { plainText } from '../../../shared/document/extract';
import type {
  ProcedureFacets,
  ProcedurePage,
  ProcedureSort,
  procedureListQuery,
  RevisionView,
  saveRevisionBody,
} from '../../../shared/schemas/procedures';
import type { Db, Tx } from '../../db/client';
import {
  people,
  procedureListing,
  procedures,
  revisions,
  type ListingAudience,
  type RevisionState,
} from '../../db/schema';
import { conflict, notFound } from '../../http/errors';
import type { SessionUser } from '../../http/route';
import { renderRevisionHtml } from './render-html';

type RevisionRow = typeof revisions.$inferSelect;

/** Only technicians are limited to published revisions; authors, reviewers and admins see all. */
export const seesDrafts = (user: SessionUser) => user.roles.some((r) => r !== 'technician');
/** The states a technician may read: approved now, or before. */
export const PUBLISHED_STATES = ['approved', 'superseded'] as const satisfies readonly RevisionState[];

/** Everything the server derives from a document: snapshot, sanitized HTML, plain text. */
export function derive(doc: ProcedureDoc, params: ProcedureParams) {
  const snapshot = evaluateDocument(doc, params);
  return { snapshot, html: renderRevisionHtml(doc, snapshot), plainText: plainText(doc) };
}

type Author = { id: string; displayName: string };

export async function revisionView(db: Db | Tx, row: RevisionRow): Promise<RevisionView> {
  const [author] = await db
    .select({ id: people.id, displayName: people.displayName })
    .from(people)
    .where(eq(people.id, row.authorId));
  return toRevisionView(row, author);
}

function toRevisionView(row: RevisionRow, author: Author | undefined): RevisionView {
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
    reckoners: describeBlocks(row.document, row.snapshot),
    html: row.html,
    author: author ?? { id: row.authorId, displayName: 'unknown' },
    lockVersion: row.lockVersion,
    createdAt: row.createdAt.toISOString(),
    updatedAt: row.updatedAt.toISOString(),
    submittedAt: row.submittedAt?.toISOString() ?? null,
    decidedAt: row.decidedAt?.toISOString() ?? null,
    changeReason: row.changeReason,
    lint: lintProcedure(row.document, row.snapshot),
  };
}

// The reader's query, prepared once per database handle: the page most often opened.
const revisionWithAuthor = new WeakMap<Db, ReturnType<typeof prepareRevisionWithAuthor>>();
const prepareRevisionWithAuthor = (db: Db) =>
  db
    .select({ row: revisions, author: { id: people.id, displayName: people.displayName } })
    .from(revisions)
    .leftJoin(people, eq(people.id, revisions.authorId))
    .where(eq(revisions.id, sql.placeholder('id')))
    .prepare('revision_with_author');

/** One revision with its author's name, in one round trip; undefined when there is none. */
export async function loadRevisionView(db: Db, id: string): Promise<RevisionView | undefined> {
  return (await loadRevisionWithHash(db, id))?.view;
}

/** loadRevisionView with the content hash an approval recorded (null before approval). */
async function loadRevisionWithHash(db: Db, id: string) {
  let prepared = revisionWithAuthor.get(db);
  if (!prepared) revisionWithAuthor.set(db, (prepared = prepareRevisionWithAuthor(db)));
  const [found] = await prepared.execute({ id });
  return (
    found && {
      view: toRevisionView(found.row, found.author ?? undefined),
      contentHash: found.row.contentHash,
    }
  );
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

/**
 * Creates a procedure with revision 1 as a draft; the database refuses any other first state.
 * Demo content and tests that need it approved use createApprovedProcedure (review/transitions.ts).
 */
export async function createProcedure(db: Db | Tx, authorId: string, input: NewProcedure) {
  const params = input.params ?? defaultParams();
  const document = input.document ?? emptyDoc();
  const [procedure] = await db
    .insert(procedures)
    .values({
      title: input.title,
      equipmentFamily: input.equipmentFamily,
      equipmentModel: input.equipmentModel,
      tags: input.tags,
      ownerId: authorId,
      seedKey: input.seedKey,
    })
    .returning();
  const [revision] = await db
    .insert(revisions)
    .values({
      procedureId: procedure!.id,
      number: 1,
      state: 'draft',
      title: input.title,
      equipmentFamily: input.equipmentFamily,
      equipmentModel: input.equipmentModel,
      tags: input.tags,
      document,
      params,
      ...derive(document, params),
      authorId,
      editorIds: [authorId],
    })
    .returning();
  return { procedure: procedure!, revision: revision! };
}

/** Which listing rows a person reads: technicians only what has been approved. */
export const audienceOf = (user: SessionUser): ListingAudience => (seesDrafts(user) ? 'staff' : 'published');

const SORT_COLUMNS: Record<ProcedureSort, (dir: 'asc' | 'desc') => SQL[]> = {
  title: (d) => [
    d === 'asc' ? asc(sql`lower(${procedureListing.title})`) : desc(sql`lower(${procedureListing.title})`),
  ],
  equipment: (d) =>
    d === 'asc'
      ? [asc(procedureListing.equipmentFamily), asc(procedureListing.equipmentModel)]
      : [desc(procedureListing.equipmentFamily), desc(procedureListing.equipmentModel)],
  state: (d) => [d === 'asc' ? asc(procedureListing.state) : desc(procedureListing.state)],
  updatedAt: (d) => [d === 'asc' ? asc(procedureListing.updatedAt) : desc(procedureListing.updatedAt)],
};

type ListQuery = z.output<typeof procedureListQuery>;
const FILTERS = ['q', 'family', 'tag', 'state', 'runnable'] as const;

/** A LIKE pattern matching the text anywhere, with LIKE's own wildcards taken literally. */
const containing = (text: string) => `%${text.toLowerCase().replace(/[\\%_]/g, (c) => `\\${c}`)}%`;

/**
 * The list query for one sort and one set of filters in use, with the values as placeholders.
 * The page and the count of all matches come back in one round trip (the count as an
 * uncorrelated subquery); the procedure id breaks ties, so paging never skips or repeats a row.
 */
function buildListQuery(
  db: Db,
  sort: ProcedureSort,
  dir: 'asc' | 'desc',
  used: Set<(typeof FILTERS)[number]>,
  name: string,
) {
  const p = (key: string) => sql.placeholder(key);
  const where = and(
    eq(procedureListing.audience, p('audience')),
    used.has('q') ? sql`lower(${procedureListing.title}) like ${p('q')}` : undefined,
    used.has('family') ? eq(procedureListing.equipmentFamily, p('family')) : undefined,
    used.has('tag') ? sql`${p('tag')} = any(${procedureListing.tags})` : undefined,
    used.has('state') ? eq(procedureListing.state, p('state')) : undefined,
    used.has('runnable') ? isNotNull(procedureListing.approvedId) : undefined,
  );
  const order = [
    ...SORT_COLUMNS[sort](dir),
    dir === 'asc' ? asc(procedureListing.procedureId) : desc(procedureListing.procedureId),
  ];
  return db
    .select({
      l: procedureListing,
      owner: { id: people.id, displayName: people.displayName },
      total: sql<number>`(select count(*)::int from ${procedureListing} where ${where})`,
    })
    .from(procedureListing)
    .innerJoin(people, eq(people.id, procedureListing.ownerId))
    .where(where)
    .orderBy(...order)
    .limit(p('limit'))
    .offset(p('offset'))
    .prepare(name);
}

// Prepared once per database handle and shape: the list is read far more often than it changes,
// and planning this query costs PostgreSQL more than running it.
const preparedLists = new WeakMap<Db, Map<string, ReturnType<typeof buildListQuery>>>();

/**
 * One page of the procedures the caller may see, filtered and sorted in the database from the
 * listing read model (one row per procedure and audience, kept by a trigger on revisions).
 */
export async function listProcedures(db: Db, user: SessionUser, q: ListQuery): Promise<ProcedurePage> {
  const dir = q.dir ?? (q.sort === 'updatedAt' ? 'desc' : 'asc');
  const used = new Set(FILTERS.filter((f) => q[f]));
  const name = `procedure_list_${q.sort}_${dir}_${[...used].join('_') || 'all'}`;
  let byName = preparedLists.get(db);
  if (!byName) preparedLists.set(db, (byName = new Map()));
  let prepared = byName.get(name);
  if (!prepared) byName.set(name, (prepared = buildListQuery(db, q.sort, dir, used, name)));
  const values = {
    audience: audienceOf(user),
    q: q.q ? containing(q.q) : undefined,
    family: q.family,
    tag: q.tag?.toLowerCase(),
    state: q.state,
    limit: q.limit,
    offset: q.offset,
  };
  const rows = await prepared.execute(values);
  // Past the last page there is no row to carry the count: ask for the first row's.
  const counted =
    rows[0]?.total ??
    (q.offset > 0 ? ((await prepared.execute({ ...values, offset: 0, limit: 1 }))[0]?.total ?? 0) : 0);
  return {
    procedures: rows.map(({ l, owner }) => ({
      id: l.procedureId,
      title: l.title,
      equipmentFamily: l.equipmentFamily,
      equipmentModel: l.equipmentModel,
      tags: l.tags,
      owner,
      latest: { id: l.revisionId, number: l.number, state: l.state, updatedAt: l.updatedAt.toISOString() },
      approved: l.approvedId ? { id: l.approvedId, number: l.approvedNumber! } : null,
      updatedAt: l.updatedAt.toISOString(),
    })),
    total: counted,
    offset: q.offset,
    limit: q.limit,
  };
}

/** The families, tags and states that occur among the procedures the caller may see. */
export async function listingFacets(db: Db, user: SessionUser): Promise<ProcedureFacets> {
  const audience = audienceOf(user);
  const { rows } = await db.execute<{ families: string[]; tags: string[]; states: RevisionState[] }>(sql`
    select
      array(select distinct equipment_family from procedure_listing where audience = ${audience} order by 1) as families,
      array(select distinct t from procedure_listing, unnest(tags) t where audience = ${audience} order by 1) as tags,
      array(select distinct state from procedure_listing where audience = ${audience} order by 1) as states`);
  return rows[0] ?? { families: [], tags: [], states: [] };
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

/** A named revision a draft may start from: this procedure's, approved or returned. */
async function startableRevision(tx: Tx, procedureId: string, revisionId: string) {
  const [row] = await tx
    .select()
    .from(revisions)
    .where(and(eq(revisions.id, revisionId), eq(revisions.procedureId, procedureId)));
  if (!row) throw notFound('This procedure has no such revision.');
  if (row.state !== 'approved' && row.state !== 'returned')
    throw conflict(
      `Revision ${row.number} is ${row.state.replace('_', ' ')}; a new draft starts from an approved or returned revision.`,
      { state: row.state },
    );
  return row;
}

export async function nextRevisionNumber(db: Db | Tx, procedureId: string) {
  const [row] = await db
    .select({ n: sql<number>`coalesce(max(${revisions.number}), 0) + 1` })
    .from(revisions)
    .where(eq(revisions.procedureId, procedureId));
  return Number(row!.n);
}

/** createProcedure in a transaction of its own (the API's "new procedure"). */
export const createProcedureDraft = (db: Db, authorId: string, input: NewProcedure) =>
  db.transaction((tx) => createProcedure(tx, authorId, input));

const isPublished = (state: RevisionState) => (PUBLISHED_STATES as readonly RevisionState[]).includes(state);

/** A procedure and the revisions the caller may see (404 when they may see none). */
export async function procedureWithRevisions(db: Db, user: SessionUser, id: string) {
  const [procedure] = await db.select().from(procedures).where(eq(procedures.id, id));
  if (!procedure) throw notFound('No such procedure.');
  const rows = await db
    .select({
      id: revisions.id,
      number: revisions.number,
      state: revisions.state,
      updatedAt: revisions.updatedAt,
      changeReason: revisions.changeReason,
      author: { id: people.id, displayName: people.displayName },
    })
    .from(revisions)
    .innerJoin(people, eq(people.id, revisions.authorId))
    .where(eq(revisions.procedureId, id))
    .orderBy(asc(revisions.number));
  const visible = rows.filter((r) => seesDrafts(user) || isPublished(r.state));
  if (!visible.length) throw notFound('No such procedure.');
  return {
    procedure: {
      id: procedure.id,
      title: procedure.title,
      equipmentFamily: procedure.equipmentFamily,
      equipmentModel: procedure.equipmentModel,
      tags: procedure.tags,
    },
    revisions: visible.map((r) => ({ ...r, updatedAt: r.updatedAt.toISOString() })),
  };
}

/**
 * One revision as the caller may read it: technicians see published revisions only. `frozen`: its
 * content can no longer change (approved or superseded), so its answer may be kept by content hash.
 */
export async function readableRevision(db: Db, user: SessionUser, id: string) {
  const found = await loadRevisionWithHash(db, id);
  const revision = found?.view;
  if (!revision || (!seesDrafts(user) && !isPublished(revision.state))) throw notFound('No such revision.');
  return { revision, contentHash: found.contentHash, frozen: isPublished(revision.state) };
}

/**
 * Starts the next draft from `fromRevisionId` (an approved or returned revision of this procedure),
 * else from the approved revision (or, when none was approved, the latest returned one).
 */
export async function startNextDraft(
  db: Db,
  user: SessionUser,
  procedureId: string,
  fromRevisionId?: string,
) {
  const row = await db.transaction(async (tx) => {
    await tx.execute(sql`select 1 from ${procedures} where ${procedures.id} = ${procedureId} for update`);
    const open = await tx
      .select({ id: revisions.id, number: revisions.number, state: revisions.state })
      .from(revisions)
      .where(and(eq(revisions.procedureId, procedureId), sql`${revisions.state} in ('draft', 'in_review')`));
    if (open[0])
      throw conflict(
        `Revision ${open[0].number} is already ${open[0].state === 'draft' ? 'a draft' : 'in review'}; continue that one.`,
        { revisionId: open[0].id },
      );
    const base = fromRevisionId
      ? await startableRevision(tx, procedureId, fromRevisionId)
      : ((await latestApproved(tx, procedureId)) ?? (await latestInState(tx, procedureId, 'returned')));
    if (!base) throw notFound('This procedure has no approved or returned revision to start from.');
    const [created] = await tx
      .insert(revisions)
      .values({
        procedureId: base.procedureId,
        number: await nextRevisionNumber(tx, procedureId),
        state: 'draft',
        title: base.title,
        equipmentFamily: base.equipmentFamily,
        equipmentModel: base.equipmentModel,
        tags: base.tags,
        document: base.document,
        params: base.params,
        ...derive(base.document, base.params),
        authorId: user.id,
        editorIds: [user.id],
        // Whoever wrote the revision this starts from still counts as its author for four eyes.
        provenanceIds: [...new Set([base.authorId, ...base.editorIds, ...base.provenanceIds])].filter(
          (id) => id !== user.id,
        ),
      })
      .returning();
    return created!;
  });
  return revisionView(db, row);
}

/**
 * Saves a draft under its optimistic lock, and the procedure's title and equipment with it, in one
 * transaction. A stale lockVersion or a revision no longer a draft gets 409 with the current revision.
 */
export async function saveDraft(
  db: Db,
  user: SessionUser,
  id: string,
  body: z.output<typeof saveRevisionBody>,
  document: ProcedureDoc,
) {
  const saved = await db.transaction(async (tx) => {
    const [saved] = await tx
      .update(revisions)
      .set({
        title: body.title,
        equipmentFamily: body.equipmentFamily,
        equipmentModel: body.equipmentModel,
        tags: body.tags,
        document,
        params: body.params,
        ...derive(document, body.params),
        lockVersion: sql`${revisions.lockVersion} + 1`,
        editorIds: sql`case when ${user.id}::uuid = any(${revisions.editorIds}) then ${revisions.editorIds} else array_append(${revisions.editorIds}, ${user.id}::uuid) end`,
        updatedAt: new Date(),
      })
      .where(
        and(eq(revisions.id, id), eq(revisions.lockVersion, body.lockVersion), eq(revisions.state, 'draft')),
      )
      .returning();
    if (!saved) return undefined;
    await tx
      .update(procedures)
      .set({
        title: saved.title,
        equipmentFamily: saved.equipmentFamily,
        equipmentModel: saved.equipmentModel,
        tags: saved.tags,
        updatedAt: new Date(),
      })
      .where(eq(procedures.id, saved.procedureId));
    return saved;
  });
  if (saved) return revisionView(db, saved);
  const current = await getRevisionRow(db, id);
  if (!current) throw notFound('No such revision.');
  const view = await revisionView(db, current);
  if (current.state !== 'draft')
    throw conflict(
      `Revision ${current.number} is ${current.state.replace('_', ' ')}; only drafts can be edited.`,
      {
        state: current.state,
        current: view,
      },
    );
  throw conflict(
    'Someone saved this draft after you opened it. Compare the two versions and choose which to keep.',
    { current: view },
  );
}
