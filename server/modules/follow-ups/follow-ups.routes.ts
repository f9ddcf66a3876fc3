import { z } from 'zod';
import { dispositionBody, followUpListQuery, ownerBody } from '../../../shared/schemas/follow-ups';
import { idIn } from '../../http/params';
import { defineRoute } from '../../http/route';
import { decideFollowUp, listFollowUps, reassignFollowUp } from './follow-ups.service';

const followUpParams = z.object({ id: idIn('follow-up') }).strict();

export const followUpRoutes = [
  defineRoute({
    method: 'get',
    path: '/follow-ups',
    access: 'signed-in',
    summary:
      'Non-conformance follow-ups, open first (status = open | closed | all): readings, owner, disposition, closure',
    query: followUpListQuery,
    handler: async ({ query, deps }) => ({
      followUps: await listFollowUps(deps.db, { status: query.status ?? 'all' }),
    }),
  }),

  defineRoute({
    method: 'post',
    path: '/follow-ups/:id/disposition',
    access: ['technician', 'reviewer', 'admin'],
    summary:
      'Record a disposition: repair and re-run (owner, reviewer, admin; stays open until a passing re-run), accept with a reason (reviewer; closes), return unrepaired with a reason (closes; unit returned)',
    params: followUpParams,
    body: dispositionBody,
    handler: async ({ req, params, body, user, deps }) => ({
      followUp: await decideFollowUp(deps.db, user!, params.id, body, { req }),
    }),
  }),

  defineRoute({
    method: 'post',
    path: '/follow-ups/:id/owner',
    access: ['reviewer', 'admin'],
    summary: 'Give an open follow-up to another active technician or reviewer (audited)',
    params: followUpParams,
    body: ownerBody,
    handler: async ({ req, params, body, user, deps }) => ({
      followUp: await reassignFollowUp(deps.db, user!, params.id, body.ownerId, req),
    }),
  }),
];
