import { z } from 'zod';
import {
  deviationDecisionBody,
  holdDecisionBody,
  SENIOR_ROLES,
  stepExceptionBody,
} from '../../../shared/schemas/run-decisions';
import { idIn } from '../../http/params';
import { defineRoute } from '../../http/route';
import { awaitingDecisions, decideDeviation, decideHold, recordStepException } from './run-decisions';
import { loadRunView } from './run-view';

const runParams = z.object({ id: idIn('run') }).strict();
const holdParams = z.object({ id: idIn('run'), holdId: idIn('hold') }).strict();
const exceptionParams = z.object({ id: idIn('run'), exceptionId: idIn('step record') }).strict();

/** Registered before the run routes: `/runs/awaiting-decision` is not a run id. */
export const runDecisionRoutes = [
  defineRoute({
    method: 'get',
    path: '/runs/awaiting-decision',
    access: [...SENIOR_ROLES],
    summary:
      'Hold points and deviations on open runs waiting for a senior’s decision (runs the caller performs left out)',
    handler: async ({ user, deps }) => ({ awaiting: await awaitingDecisions(deps.db, user!) }),
  }),

  defineRoute({
    method: 'post',
    path: '/runs/:id/holds/:holdId/decision',
    access: [...SENIOR_ROLES],
    summary:
      'Decide a run stopped at a hold point: continue (with a reason) or abandon; once, by a reviewer or admin not on the run; audited',
    params: holdParams,
    body: holdDecisionBody,
    handler: async ({ req, params, body, user, deps }) => {
      await decideHold(deps.db, user!, params.id, params.holdId, body, req);
      return { run: await loadRunView(deps.db, deps.files, params.id) };
    },
  }),

  defineRoute({
    method: 'post',
    path: '/runs/:id/exceptions',
    access: ['technician'],
    summary:
      'Record a step as not applicable (with why) or as a deviation (what was done instead), by the run’s performer; audited',
    params: runParams,
    body: stepExceptionBody,
    handler: async ({ req, res, params, body, user, deps }) => {
      await recordStepException(deps.db, user!, params.id, body, req);
      res.status(201);
      return { run: await loadRunView(deps.db, deps.files, params.id) };
    },
  }),

  defineRoute({
    method: 'post',
    path: '/runs/:id/exceptions/:exceptionId/decision',
    access: [...SENIOR_ROLES],
    summary:
      'Approve or refuse a deviation, with a note; once, by a reviewer or admin not on the run; the run is signed only after',
    params: exceptionParams,
    body: deviationDecisionBody,
    handler: async ({ req, params, body, user, deps }) => {
      await decideDeviation(deps.db, user!, params.id, params.exceptionId, body, req);
      return { run: await loadRunView(deps.db, deps.files, params.id) };
    },
  }),
];
