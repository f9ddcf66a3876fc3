import { z } from 'zod';
import { idIn } from '../../http/params';
import { BLOCK_ID } from '../../../shared/document/schema';
import {
  abandonBody,
  entryBody,
  handoverBody,
  runListQuery,
  signRunBody,
  startRunBody,
  witnessRunBody,
} from '../../../shared/schemas/runs';
import { idempotencyKeyHeader } from '../../http/idempotency-key';
import { defineRoute } from '../../http/route';
import { runSheetPdf } from './run-sheet-file';
import { releaseRunBody } from '../../../shared/schemas/follow-ups';
import { entryAnswerOf } from './entry-answer';
import { receivePhoto } from './photo-upload';
import { abandonRun, handOverRun } from './run-custody';
import { releaseRun } from './run-release';
import { signRun, witnessRun } from './run-sign';
import { listRuns, loadRunView } from './run-view';
import { activeTechnicians, addRunPhoto, recordEntry, runEligibility, startRun } from './runs.service';

const runParams = z.object({ id: idIn('run') }).strict();
const entryParams = z
  .object({
    id: idIn('run'),
    stepId: z.string().regex(BLOCK_ID, 'The step address is not valid').meta({ title: 'Step address' }),
  })
  .strict();

export const runRoutes = [
  defineRoute({
    method: 'get',
    path: '/runs',
    access: 'signed-in',
    summary: 'Bench runs, newest first (filter by status, unit, or mine=1)',
    query: runListQuery,
    handler: async ({ query, user, deps }) => ({
      runs: await listRuns(deps.db, {
        status: query.status,
        unitId: query.unitId,
        performedBy: query.mine ? user!.id : undefined,
      }),
    }),
  }),

  // Before /runs/:id, which would take "technicians" for a run id.
  defineRoute({
    method: 'get',
    path: '/runs/technicians',
    access: ['technician', 'admin'],
    summary: 'Active technicians, to whom a bench run can be handed over',
    handler: async ({ deps }) => ({
      technicians: await activeTechnicians(deps.db),
    }),
  }),

  defineRoute({
    method: 'get',
    path: '/runs/eligibility',
    access: ['technician'],
    summary:
      'Before starting: may I run this revision alone (qualified for its family and, for live work, live work)? If not, why, and who could witness',
    query: z.object({ revisionId: z.uuid('not a valid revision id') }).strict(),
    handler: async ({ query, user, deps }) => ({
      eligibility: await runEligibility(deps.db, user!.id, query.revisionId),
    }),
  }),

  defineRoute({
    method: 'post',
    path: '/runs',
    access: ['technician'],
    summary:
      'Start a bench run on an approved revision and a unit, with the measured mains (409 unless approved)',
    before: idempotencyKeyHeader,
    body: startRunBody,
    handler: async ({ res, body, user, deps }) => {
      const { run, created } = await startRun(deps.db, deps.files, user!, body);
      res.status(created ? 201 : 200);
      return { run: await loadRunView(deps.db, deps.files, run.id) };
    },
  }),

  defineRoute({
    method: 'get',
    path: '/runs/:id',
    access: 'signed-in',
    summary: 'One bench run: steps, entries with their history, photos, signature (verified on read)',
    params: runParams,
    handler: async ({ params, deps }) => ({ run: await loadRunView(deps.db, deps.files, params.id) }),
  }),

  defineRoute({
    method: 'put',
    path: '/runs/:id/entries/:stepId',
    access: ['technician'],
    summary:
      'Record a reading, tick a check step or acknowledge a hazard note (idempotent by key; the server decides within/out)',
    before: idempotencyKeyHeader,
    params: entryParams,
    body: entryBody,
    // Answers what changed (shared/runs/entry-answer.ts), not the whole run.
    handler: async ({ params, body, user, deps }) =>
      entryAnswerOf(deps.db, user!, await recordEntry(deps.db, user!, params.id, params.stepId, body)),
  }),

  defineRoute({
    method: 'post',
    path: '/runs/:id/photos',
    access: ['technician'],
    summary: 'Add a photo to a run, optionally to one step (PNG, JPEG, WebP judged by content; 15 MB)',
    params: runParams,
    before: receivePhoto,
    handler: async ({ req, res, params, user, deps }) => {
      const stepId = typeof req.body?.stepId === 'string' && req.body.stepId !== '' ? req.body.stepId : null;
      const photo = await addRunPhoto(deps, user!, params.id, stepId, req.file);
      res.status(201);
      return { photo };
    },
  }),

  defineRoute({
    method: 'post',
    path: '/runs/:id/sign',
    access: ['technician'],
    summary:
      'Sign the run sheet as performed (password again; 409 naming unfinished steps); then it is immutable',
    params: runParams,
    body: signRunBody,
    handler: async ({ req, params, body, user, deps }) => {
      await signRun(deps, user!, params.id, body, req);
      return { run: await loadRunView(deps.db, deps.files, params.id) };
    },
  }),

  defineRoute({
    method: 'post',
    path: '/runs/:id/witness',
    access: ['technician'],
    summary:
      'The named witness co-signs a trainee’s finished run as witnessed (password again); the trainee signs after it',
    params: runParams,
    body: witnessRunBody,
    handler: async ({ req, params, body, user, deps }) => {
      await witnessRun(deps, user!, params.id, body.password, req);
      return { run: await loadRunView(deps.db, deps.files, params.id) };
    },
  }),

  defineRoute({
    method: 'post',
    path: '/runs/:id/release',
    access: ['technician', 'reviewer'],
    summary:
      'Sign a performed run as checked and released (password again): a reviewer or a qualified technician, never its performer; 409 while a follow-up bars it; the unit becomes released',
    params: runParams,
    body: releaseRunBody,
    handler: async ({ req, params, body, user, deps }) => {
      await releaseRun(deps, user!, params.id, body.password, req);
      return { run: await loadRunView(deps.db, deps.files, params.id) };
    },
  }),

  defineRoute({
    method: 'post',
    path: '/runs/:id/handover',
    access: ['technician', 'admin'],
    summary:
      'Hand an open run over to another technician, with a reason (its performer, or an admin); recorded, audited and named on the sheet',
    params: runParams,
    body: handoverBody,
    handler: async ({ req, params, body, user, deps }) => {
      await handOverRun(deps.db, user!, params.id, body, req);
      return { run: await loadRunView(deps.db, deps.files, params.id) };
    },
  }),

  defineRoute({
    method: 'post',
    path: '/runs/:id/abandon',
    access: ['technician', 'admin'],
    summary:
      'Close an open run as abandoned, with a reason (its performer, or an admin); audited, then nothing on it changes',
    params: runParams,
    body: abandonBody,
    handler: async ({ req, params, body, user, deps }) => {
      await abandonRun(deps.db, user!, params.id, body.reason, req);
      return { run: await loadRunView(deps.db, deps.files, params.id) };
    },
  }),

  defineRoute({
    method: 'get',
    path: '/runs/:id/sheet.pdf',
    access: 'signed-in',
    summary:
      'The run sheet as a PDF for the customer’s file, with the safety caution and the revision’s approval record',
    params: runParams,
    handler: async ({ res, params, deps }) => {
      const run = await loadRunView(deps.db, deps.files, params.id);
      const pdf = await runSheetPdf(deps.db, deps.files, run);
      const name = `run-sheet-${run.unit.model}-${run.unit.serial}-${run.id.slice(0, 8)}.pdf`.replace(
        /[^A-Za-z0-9._-]/g,
        '_',
      );
      res.set({
        'Content-Type': 'application/pdf',
        'Content-Length': String(pdf.length),
        'Content-Disposition': `attachment; filename="${name}"`,
        'X-Content-Type-Options': 'nosniff',
        'Cache-Control': 'private, no-store',
      });
      res.end(pdf);
    },
  }),
];
