import { and, asc, eq, sql } from 'drizzle-orm';
import { z } from 'zod';
import {
  createProcedureBody,
  procedureListQuery,
  saveRevisionBody,
} from '../../../shared/schemas/procedures';
import { people, procedures, revisions } from '../../db/schema';
import { badRequest, conflict, HttpError, notFound } from '../../http/errors';
import { defineRoute } from '../../http/route';
import { checkDocument } from './document-check';
import {
  createProcedure,
  derive,
  getRevisionRow,
  latestApproved,
  latestInState,
  listingFacets,
  listProcedures,
  loadRevisionView,
  nextRevisionNumber,
  revisionView,
  seesDrafts,
} from './procedures.service';

const procedureParams = z.object({ id: z.uuid('not a valid procedure id') });
const revisionParams = z.object({ id: z.uuid('not a valid revision id') });
const PUBLISHED = new Set(['approved', 'superseded']);

export const procedureRoutes = [
  defineRoute({
    method: 'get',
    path: '/procedures',
    access: 'signed-in',
    summary:
      'One page of the procedures the caller may see, filtered and sorted (technicians: approved only)',
    query: procedureListQuery,
    handler: ({ query, user, deps }) => listProcedures(deps.db, user!, query),
  }),

  defineRoute({
    method: 'get',
    path: '/procedures/facets',
    access: 'signed-in',
    summary: 'The families, tags and states the procedure list can be filtered by',
    handler: async ({ user, deps }) => ({ facets: await listingFacets(deps.db, user!) }),
  }),

  defineRoute({
    method: 'post',
    path: '/procedures',
    access: ['author'],
    summary: 'Create a procedure with an empty first draft',
    body: createProcedureBody,
    handler: async ({ res, body, user, deps }) => {
      const created = await deps.db.transaction((tx) => createProcedure(tx, user!.id, body));
      res.status(201);
      return {
        procedure: { id: created.procedure.id },
        revision: await revisionView(deps.db, created.revision),
      };
    },
  }),

  defineRoute({
    method: 'get',
    path: '/procedures/:id',
    access: 'signed-in',
    summary: 'One procedure and the revisions the caller may see',
    params: procedureParams,
    handler: async ({ params, user, deps }) => {
      const [procedure] = await deps.db.select().from(procedures).where(eq(procedures.id, params.id));
      if (!procedure) throw notFound('No such procedure.');
      const rows = await deps.db
        .select({
          id: revisions.id,
          number: revisions.number,
          state: revisions.state,
          updatedAt: revisions.updatedAt,
          author: { id: people.id, displayName: people.displayName },
        })
        .from(revisions)
        .innerJoin(people, eq(people.id, revisions.authorId))
        .where(eq(revisions.procedureId, params.id))
        .orderBy(asc(revisions.number));
      const visible = rows.filter((r) => seesDrafts(user!) || PUBLISHED.has(r.state));
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
    },
  }),

  defineRoute({
    method: 'post',
    path: '/procedures/:id/drafts',
    access: ['author'],
    summary: 'Start the next draft from the approved revision',
    params: procedureParams,
    handler: async ({ res, params, user, deps }) => {
      const row = await deps.db.transaction(async (tx) => {
        await tx.execute(sql`select 1 from ${procedures} where ${procedures.id} = ${params.id} for update`);
        const open = await tx
          .select({ id: revisions.id, number: revisions.number, state: revisions.state })
          .from(revisions)
          .where(
            and(eq(revisions.procedureId, params.id), sql`${revisions.state} in ('draft', 'in_review')`),
          );
        if (open[0])
          throw conflict(
            `Revision ${open[0].number} is already ${open[0].state === 'draft' ? 'a draft' : 'in review'}; continue that one.`,
            { revisionId: open[0].id },
          );
        // From the approved revision; when none was ever approved, from the latest returned one.
        const base =
          (await latestApproved(tx, params.id)) ?? (await latestInState(tx, params.id, 'returned'));
        if (!base) throw notFound('This procedure has no approved or returned revision to start from.');
        const [created] = await tx
          .insert(revisions)
          .values({
            procedureId: base.procedureId,
            number: await nextRevisionNumber(tx, params.id),
            state: 'draft',
            title: base.title,
            equipmentFamily: base.equipmentFamily,
            equipmentModel: base.equipmentModel,
            tags: base.tags,
            document: base.document,
            params: base.params,
            ...derive(base.document, base.params),
            authorId: user!.id,
            editorIds: [user!.id],
            // Whoever wrote the revision this starts from still counts as its author for four eyes.
            provenanceIds: [...new Set([base.authorId, ...base.editorIds, ...base.provenanceIds])].filter(
              (id) => id !== user!.id,
            ),
          })
          .returning();
        return created!;
      });
      res.status(201);
      return { revision: await revisionView(deps.db, row) };
    },
  }),

  defineRoute({
    method: 'get',
    path: '/revisions/:id',
    access: 'signed-in',
    summary: 'One revision: document, evaluated snapshot, procedure check',
    params: revisionParams,
    handler: async ({ params, user, deps }) => {
      const revision = await loadRevisionView(deps.db, params.id);
      if (!revision || (!seesDrafts(user!) && !PUBLISHED.has(revision.state)))
        throw notFound('No such revision.');
      return { revision };
    },
  }),

  defineRoute({
    method: 'put',
    path: '/revisions/:id',
    access: ['author'],
    summary: 'Save a draft (optimistic lock: a stale lockVersion gets 409 with the current revision)',
    params: revisionParams,
    body: saveRevisionBody,
    handler: async ({ req, params, body, user, deps }) => {
      const ifMatch = req.get('if-match');
      if (ifMatch && ifMatch.replace(/"/g, '') !== String(body.lockVersion)) {
        throw badRequest('If-Match and lockVersion disagree.', [
          { field: 'body.lockVersion', reason: 'does not match the If-Match header' },
        ]);
      }
      const checked = checkDocument(body.document);
      if (!checked.ok) {
        throw new HttpError(
          400,
          `The document was refused: ${checked.problems
            .slice(0, 3)
            .map((p) => `${p.field}: ${p.reason}`)
            .join('; ')}`,
          { fields: checked.problems },
        );
      }
      const derived = derive(checked.doc, body.params);
      const [saved] = await deps.db
        .update(revisions)
        .set({
          title: body.title,
          equipmentFamily: body.equipmentFamily,
          equipmentModel: body.equipmentModel,
          tags: body.tags,
          document: checked.doc,
          params: body.params,
          ...derived,
          lockVersion: sql`${revisions.lockVersion} + 1`,
          editorIds: sql`case when ${user!.id}::uuid = any(${revisions.editorIds}) then ${revisions.editorIds} else array_append(${revisions.editorIds}, ${user!.id}::uuid) end`,
          updatedAt: new Date(),
        })
        .where(
          and(
            eq(revisions.id, params.id),
            eq(revisions.lockVersion, body.lockVersion),
            eq(revisions.state, 'draft'),
          ),
        )
        .returning();
      if (!saved) {
        const current = await getRevisionRow(deps.db, params.id);
        if (!current) throw notFound('No such revision.');
        const view = await revisionView(deps.db, current);
        if (current.state !== 'draft')
          throw conflict(
            `Revision ${current.number} is ${current.state.replace('_', ' ')}; only drafts can be edited.`,
            { state: current.state, current: view },
          );
        throw conflict(
          'Someone saved this draft after you opened it. Compare the two versions and choose which to keep.',
          { current: view },
        );
      }
      await deps.db
        .update(procedures)
        .set({
          title: saved.title,
          equipmentFamily: saved.equipmentFamily,
          equipmentModel: saved.equipmentModel,
          tags: saved.tags,
          updatedAt: new Date(),
        })
        .where(eq(procedures.id, saved.procedureId));
      return { revision: await revisionView(deps.db, saved) };
    },
  }),
];
