import { z } from 'zod';
import { idIn } from '../../http/params';
import {
  createProcedureBody,
  procedureListQuery,
  saveRevisionBody,
  startDraftBody,
} from '../../../shared/schemas/procedures';
import { badRequest, HttpError } from '../../http/errors';
import { defineRoute } from '../../http/route';
import { sendJson } from '../../http/library-cache';
import type { SessionUser } from '../../http/route';
import { checkDocument } from './document-check';
import {
  audienceOf,
  createProcedureDraft,
  listingFacets,
  listProcedures,
  procedureWithRevisions,
  readableRevision,
  revisionView,
  saveDraft,
  startNextDraft,
} from './procedures.service';

const procedureParams = z.object({ id: idIn('procedure') });
/** A cache key for answers the same for every technician; null (not kept) for staff. */
const publishedOnly = (user: SessionUser, key: string) => (audienceOf(user) === 'published' ? key : null);
const revisionParams = z.object({ id: idIn('revision') });

export const procedureRoutes = [
  defineRoute({
    method: 'get',
    path: '/procedures',
    access: 'signed-in',
    summary:
      'One page of the procedures the caller may see, filtered and sorted (technicians: approved only)',
    query: procedureListQuery,
    // Technicians' list (approved only) changes only when the library does; staff see drafts too.
    handler: async ({ req, res, query, user, deps }) =>
      sendJson(
        req,
        res,
        await deps.library.answer(publishedOnly(user!, `list:${JSON.stringify(query)}`), () =>
          listProcedures(deps.db, user!, query),
        ),
      ),
  }),

  defineRoute({
    method: 'get',
    path: '/procedures/facets',
    access: 'signed-in',
    summary: 'The families, tags and states the procedure list can be filtered by',
    handler: async ({ req, res, user, deps }) =>
      sendJson(
        req,
        res,
        await deps.library.answer(publishedOnly(user!, 'facets'), async () => ({
          facets: await listingFacets(deps.db, user!),
        })),
      ),
  }),

  defineRoute({
    method: 'post',
    path: '/procedures',
    access: ['author'],
    summary: 'Create a procedure with an empty first draft',
    body: createProcedureBody,
    handler: async ({ res, body, user, deps }) => {
      const created = await createProcedureDraft(deps.db, user!.id, body);
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
      return procedureWithRevisions(deps.db, user!, params.id);
    },
  }),

  defineRoute({
    method: 'post',
    path: '/procedures/:id/drafts',
    access: ['author'],
    summary:
      'Start the next draft from the approved revision, or from a named approved or returned revision (fromRevisionId)',
    params: procedureParams,
    body: startDraftBody,
    handler: async ({ res, params, body, user, deps }) => {
      const revision = await startNextDraft(deps.db, user!, params.id, body.fromRevisionId);
      res.status(201);
      return { revision };
    },
  }),

  defineRoute({
    method: 'get',
    path: '/revisions/:id',
    access: 'signed-in',
    summary: 'One revision: document, evaluated snapshot, procedure check',
    params: revisionParams,
    handler: async ({ req, res, params, user, deps }) => {
      const audience = audienceOf(user!);
      const kept = deps.library.reading(params.id);
      if (kept) return sendJson(req, res, kept.body, { digest: kept.digest, audience });
      const began = deps.library.begin();
      const { revision, contentHash, frozen } = await readableRevision(deps.db, user!, params.id);
      const { procedureId } = revision;
      const reading = deps.library.keepReading(
        began,
        { revisionId: params.id, procedureId, contentHash, frozen },
        { revision },
      );
      sendJson(req, res, reading.body, frozen ? { digest: reading.digest, audience } : undefined);
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
      return { revision: await saveDraft(deps.db, user!, params.id, body, checked.doc) };
    },
  }),
];
