import { z } from 'zod';
import { idIn } from '../../http/params';
import { unitBody, unitListQuery, updateUnitBody } from '../../../shared/schemas/units';
import { oneLine } from '../../http/clean-text';
import { defineRoute } from '../../http/route';
import { unitStateBody } from '../../../shared/schemas/follow-ups';
import { receivePhoto } from '../runs/photo-upload';
import { setUnitState, unitStateHistory } from './unit-state';
import {
  addUnitPhoto,
  listUnits,
  registerUnit,
  unitById,
  unitPhotosOf,
  unitRuns,
  unitTrend,
  updateUnit,
} from './units.service';

/** Everyone who works on units at the bench or writes about them may keep the register. */
const KEEPERS = ['technician', 'author', 'reviewer', 'admin'] as const;
const unitParams = z.object({ id: idIn('unit') }).strict();

export const unitRoutes = [
  defineRoute({
    method: 'get',
    path: '/units',
    access: 'signed-in',
    summary: 'The unit register: search (q) and filters (model, state = open-run | out | never-run)',
    query: unitListQuery,
    handler: async ({ query, deps }) => listUnits(deps.db, query),
  }),

  defineRoute({
    method: 'post',
    path: '/units',
    access: KEEPERS,
    summary: 'Register a unit on the bench (model, serial, owner or job number, notes)',
    body: unitBody,
    handler: async ({ res, body, user, deps }) => {
      const unit = await registerUnit(deps.db, user!.id, body);
      res.status(201);
      return { unit };
    },
  }),

  defineRoute({
    method: 'get',
    path: '/units/:id',
    access: 'signed-in',
    summary: 'One unit with its photos and every bench run on it',
    params: unitParams,
    handler: async ({ params, deps }) => {
      const unit = await unitById(deps.db, params.id);
      return {
        unit,
        photos: await unitPhotosOf(deps.db, params.id),
        runs: await unitRuns(deps.db, params.id),
        states: await unitStateHistory(deps.db, params.id),
      };
    },
  }),

  defineRoute({
    method: 'put',
    path: '/units/:id',
    access: KEEPERS,
    summary: 'Edit a unit (optimistic lock: a stale lockVersion gets 409 with the current unit)',
    params: unitParams,
    body: updateUnitBody,
    handler: async ({ params, body, deps }) => {
      return { unit: await updateUnit(deps.db, params.id, body) };
    },
  }),

  defineRoute({
    method: 'post',
    path: '/units/:id/photos',
    access: KEEPERS,
    summary: 'Add a photo of the unit (PNG, JPEG, WebP judged by content; 15 MB), with an optional caption',
    params: unitParams,
    before: receivePhoto,
    handler: async ({ req, res, params, user, deps }) => {
      const caption = typeof req.body?.caption === 'string' ? oneLine(req.body.caption, 200) : '';
      const photo = await addUnitPhoto(deps, params.id, req.file, caption, user!.id);
      res.status(201);
      return { photo };
    },
  }),

  defineRoute({
    method: 'post',
    path: '/units/:id/state',
    access: ['technician', 'reviewer', 'admin'],
    summary:
      'Put a unit on the bench, waiting for parts or returned, with a reason (audited); released follows only a release signature',
    params: unitParams,
    body: unitStateBody,
    handler: async ({ req, params, body, user, deps }) => {
      await setUnitState(deps.db, user!, params.id, body, req);
      return { states: await unitStateHistory(deps.db, params.id) };
    },
  }),

  defineRoute({
    method: 'get',
    path: '/units/:id/trend',
    access: 'signed-in',
    summary: 'One reading (by reading id) across every run on this unit, with its tolerance band',
    params: unitParams,
    query: z.object({ reading: z.string().max(40).optional() }).strict(),
    handler: async ({ params, query, deps }) => {
      await unitById(deps.db, params.id);
      return unitTrend(deps.db, params.id, query.reading);
    },
  }),
];
