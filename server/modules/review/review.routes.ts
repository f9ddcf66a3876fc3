import { z } from 'zod';
import { idIn } from '../../http/params';
import {
  approveBody,
  commentBody,
  returnBody,
  submitBody,
  withdrawBody,
} from '../../../shared/schemas/review';
import type { AppDeps } from '../../deps';
import { badRequest, notFound } from '../../http/errors';
import { defineRoute, type SessionUser } from '../../http/route';
import { getRevisionRow, PUBLISHED_STATES, revisionView, seesDrafts } from '../procedures/procedures.service';
import { addComment, signatureById } from './review.service';
import { blockRefs, buildReviewView, reviewQueue } from './review-view';
import { signatureView, verifiedSignatures, verifySignature } from './signatures';
import { decideRevision, submitRevision, withdrawProcedure } from './transitions';

const revisionParams = z.object({ id: idIn('revision') });
const procedureParams = z.object({ id: idIn('procedure') });
const signatureParams = z.object({ id: idIn('signature') });

/** Technicians see only what has been approved (now or before); everyone else sees every state. */
const PUBLISHED = new Set<string>(PUBLISHED_STATES);
const canSee = (user: SessionUser, state: string) => seesDrafts(user) || PUBLISHED.has(state);

async function decisionResponse(deps: AppDeps, result: Awaited<ReturnType<typeof decideRevision>>) {
  return {
    revision: await revisionView(deps.db, result.revision),
    signature: signatureView(
      result.signature,
      (await verifySignature(deps.db, deps.files, result.signature)).verified,
    ),
    superseded: result.superseded ? { id: result.superseded.id, number: result.superseded.number } : null,
  };
}

export const reviewRoutes = [
  defineRoute({
    method: 'get',
    path: '/review/queue',
    access: ['reviewer'],
    summary: 'Revisions waiting for review, oldest first',
    handler: async ({ user, deps }) => ({ items: await reviewQueue(deps.db, user!) }),
  }),

  defineRoute({
    method: 'get',
    path: '/revisions/:id/review',
    access: ['author', 'reviewer', 'admin'],
    summary:
      'A revision for review: text diff and value changes against the last approved revision, comments, signatures',
    params: revisionParams,
    handler: async ({ params, user, deps }) => {
      const row = await getRevisionRow(deps.db, params.id);
      if (!row) throw notFound('No such revision.');
      return { review: await buildReviewView(deps.db, deps.files, user!, row) };
    },
  }),

  defineRoute({
    method: 'post',
    path: '/revisions/:id/submit',
    access: ['author'],
    summary:
      'Submit a draft for review with its change reason (its author or an editor); refused while reckoners have errors or readings are unresolved',
    params: revisionParams,
    body: submitBody,
    handler: async ({ req, params, body, user, deps }) => {
      const row = await submitRevision(deps, user!, params.id, body, req);
      return { revision: await revisionView(deps.db, row) };
    },
  }),

  defineRoute({
    method: 'post',
    path: '/revisions/:id/approve',
    access: ['reviewer'],
    summary: 'Approve a revision in review with a signed decision (password re-entered; never one’s own)',
    params: revisionParams,
    body: approveBody,
    handler: async ({ req, params, body, user, deps }) =>
      decisionResponse(deps, await decideRevision(deps, user!, params.id, 'approved', body, req)),
  }),

  defineRoute({
    method: 'post',
    path: '/revisions/:id/return',
    access: ['reviewer'],
    summary:
      'Return a revision in review to its author with comments, signed (password re-entered; never one’s own)',
    params: revisionParams,
    body: returnBody,
    handler: async ({ req, params, body, user, deps }) =>
      decisionResponse(deps, await decideRevision(deps, user!, params.id, 'returned', body, req)),
  }),

  defineRoute({
    method: 'post',
    path: '/procedures/:id/withdraw',
    access: ['admin', 'reviewer'],
    summary: 'Withdraw a procedure’s approved revision from use, signed with a reason (password re-entered)',
    params: procedureParams,
    body: withdrawBody,
    handler: async ({ req, params, body, user, deps }) => {
      const result = await withdrawProcedure(deps, user!, params.id, body, req);
      return {
        revision: await revisionView(deps.db, result.revision),
        signature: signatureView(
          result.signature,
          (await verifySignature(deps.db, deps.files, result.signature)).verified,
        ),
      };
    },
  }),

  defineRoute({
    method: 'post',
    path: '/revisions/:id/comments',
    access: ['author', 'reviewer'],
    summary: 'Comment on a revision, or on one block of it (blockId)',
    params: revisionParams,
    body: commentBody,
    handler: async ({ req, res, params, body, user, deps }) => {
      const row = await getRevisionRow(deps.db, params.id);
      if (!row) throw notFound('No such revision.');
      const blockId = body.blockId ?? null;
      if (blockId && !blockRefs(row.document).some((b) => b.id === blockId)) {
        throw badRequest(`Revision ${row.number} has no block ${blockId}.`, [
          { field: 'body.blockId', label: 'Comment on', reason: `Choose a block of revision ${row.number}` },
        ]);
      }
      const comment = await addComment(deps.db, user!, row, blockId, body.body, req);
      res.status(201);
      return { comment };
    },
  }),

  defineRoute({
    method: 'get',
    path: '/revisions/:id/signatures',
    access: 'signed-in',
    summary: 'A revision’s sign-offs, each verified against the stored revision on this read',
    params: revisionParams,
    handler: async ({ params, user, deps }) => {
      const row = await getRevisionRow(deps.db, params.id);
      if (!row || !canSee(user!, row.state)) throw notFound('No such revision.');
      return { signatures: await verifiedSignatures(deps.db, deps.files, row.id) };
    },
  }),

  defineRoute({
    method: 'get',
    path: '/signatures/:id/verify',
    access: 'signed-in',
    summary: 'Recompute a signature’s content hash and say whether the signed revision still matches it',
    params: signatureParams,
    handler: async ({ params, user, deps }) => {
      const sig = await signatureById(deps.db, params.id);
      const row = sig && (await getRevisionRow(deps.db, sig.revisionId));
      if (!sig || !row || !canSee(user!, row.state)) throw notFound('No such signature.');
      const check = await verifySignature(deps.db, deps.files, sig);
      return {
        signature: signatureView(sig, check.verified),
        storedHash: sig.contentHash,
        currentHash: check.currentHash,
        verified: check.verified,
      };
    },
  }),
];
