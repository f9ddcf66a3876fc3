import { z } from 'zod';
import { acknowledgeBody } from '../../../shared/schemas/acknowledgements';
import { defineRoute } from '../../http/route';
import { acknowledgeRevision, acknowledgementStatus, acknowledgementView } from './acknowledgements.service';

const revisionParams = z.object({ id: z.uuid('not a valid revision id') });

export const acknowledgementRoutes = [
  defineRoute({
    method: 'get',
    path: '/revisions/:id/acknowledgement',
    access: ['technician'],
    summary:
      'What changed in an approved revision (the review’s diff), and whether the caller must acknowledge it before running it',
    params: revisionParams,
    handler: async ({ params, user, deps }) => ({
      acknowledgement: await acknowledgementView(deps.db, user!, params.id),
    }),
  }),

  defineRoute({
    method: 'post',
    path: '/revisions/:id/acknowledge',
    access: ['technician'],
    summary:
      'Acknowledge having read what changed in the approved revision, over the content hash shown (append-only record)',
    params: revisionParams,
    body: acknowledgeBody,
    handler: async ({ req, res, params, body, user, deps }) => {
      const result = await acknowledgeRevision(deps.db, user!, params.id, body.contentHash, req);
      res.status(result.created ? 201 : 200);
      return { acknowledgement: result.acknowledgement };
    },
  }),

  defineRoute({
    method: 'get',
    path: '/revisions/:id/acknowledgements',
    access: ['reviewer', 'admin'],
    summary:
      'Who must acknowledge an approved revision before running it, and who has (when, over which hash)',
    params: revisionParams,
    handler: async ({ params, deps }) => ({ status: await acknowledgementStatus(deps.db, params.id) }),
  }),
];
