import { z } from 'zod';
import {
  grantBody,
  instrumentBody,
  updateInstrumentBody,
  withdrawBody,
} from '../../../shared/schemas/registers';
import { defineRoute } from '../../http/route';
import { activeTechnicians } from '../runs/runs.service';
import { receiveFile } from '../attachments/upload';
import { addCertificate, addInstrument, listInstruments, updateInstrument } from './instruments.service';
import {
  grantQualification,
  listQualifications,
  procedureFamilies,
  withdrawQualification,
} from './qualifications.service';

/** Reviewers and admins keep the registers; everyone signed in reads them. */
const KEEPERS = ['reviewer', 'admin'] as const;
const idParams = (what: string) => z.object({ id: z.uuid(`not a valid ${what} id`) }).strict();

export const registerRoutes = [
  defineRoute({
    method: 'get',
    path: '/instruments',
    access: 'signed-in',
    summary:
      'The register of test instruments, soonest calibration due first, each with why it cannot be used (past due)',
    handler: async ({ deps }) => ({ instruments: await listInstruments(deps.db) }),
  }),

  defineRoute({
    method: 'post',
    path: '/instruments',
    access: KEEPERS,
    summary: 'Add a test instrument (identifier, kind, calibration due date); audited',
    body: instrumentBody,
    handler: async ({ req, res, body, user, deps }) => {
      const instrument = await addInstrument(deps.db, user!, body, req);
      res.status(201);
      return { instrument };
    },
  }),

  defineRoute({
    method: 'put',
    path: '/instruments/:id',
    access: KEEPERS,
    summary: 'Edit a test instrument (optimistic lock: a stale lockVersion gets 409); audited',
    params: idParams('instrument'),
    body: updateInstrumentBody,
    handler: async ({ req, params, body, user, deps }) => ({
      instrument: await updateInstrument(deps.db, user!, params.id, body, req),
    }),
  }),

  defineRoute({
    method: 'post',
    path: '/instruments/:id/certificate',
    access: KEEPERS,
    summary:
      'Upload an instrument’s calibration certificate (PDF, PNG, JPEG, WebP judged by content; 15 MB); audited',
    params: idParams('instrument'),
    before: () => receiveFile('file'),
    handler: async ({ req, res, params, user, deps }) => {
      const instrument = await addCertificate(deps, user!, params.id, req.file, req);
      res.status(201);
      return { instrument };
    },
  }),

  defineRoute({
    method: 'get',
    path: '/qualifications',
    access: 'signed-in',
    summary:
      'Who may run which procedure family and who may do live work (all=1 adds withdrawn ones), with the families and technicians to grant to',
    query: z.object({ all: z.enum(['1']).optional() }).strict(),
    handler: async ({ query, deps }) => ({
      qualifications: await listQualifications(deps.db, query.all === '1'),
      families: await procedureFamilies(deps.db),
      technicians: await activeTechnicians(deps.db),
    }),
  }),

  defineRoute({
    method: 'post',
    path: '/qualifications',
    access: KEEPERS,
    summary: 'Grant a technician a procedure family or live work; audited',
    body: grantBody,
    handler: async ({ req, res, body, user, deps }) => {
      const row = await grantQualification(deps.db, user!, body, req);
      res.status(201);
      return { qualification: { id: row.id } };
    },
  }),

  defineRoute({
    method: 'post',
    path: '/qualifications/:id/withdraw',
    access: KEEPERS,
    summary: 'Withdraw a qualification, with a reason (kept as history); audited',
    params: idParams('qualification'),
    body: withdrawBody,
    handler: async ({ req, params, body, user, deps }) => {
      await withdrawQualification(deps.db, user!, params.id, body.reason, req);
      return { ok: true };
    },
  }),
];
