import { and, asc, eq, sql } from 'drizzle-orm';
import { z } from 'zod';
import { unitBody, unitListQuery, updateUnitBody } from '../../../shared/schemas/units';
import { people, unitPhotos, units } from '../../db/schema';
import { conflict, notFound } from '../../http/errors';
import { oneLine } from '../../http/clean-text';
import { defineRoute } from '../../http/route';
import { receivePhoto, storePhoto } from '../runs/photo-upload';
import { listUnits, unitRuns, unitTrend, unitView } from './units.service';

/** Everyone who works on units at the bench or writes about them may keep the register. */
const KEEPERS = ['technician', 'author', 'reviewer', 'admin'] as const;
const unitParams = z.object({ id: z.uuid('not a valid unit id') }).strict();

const isUniqueViolation = (err: unknown) =>
  (err as { code?: string; cause?: { code?: string } })?.code === '23505' ||
  (err as { cause?: { code?: string } })?.cause?.code === '23505';
const duplicate = () =>
  conflict('A unit with this model and serial is already in the register.', {
    fields: [{ field: 'body.serial', reason: 'already registered for this model' }],
  });

async function byId(db: Parameters<typeof listUnits>[0], id: string) {
  const [row] = await db
    .select({ unit: units, by: { id: people.id, displayName: people.displayName } })
    .from(units)
    .innerJoin(people, eq(people.id, units.createdBy))
    .where(eq(units.id, id));
  if (!row) throw notFound('No such unit.');
  return unitView(row.unit, row.by);
}

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
      try {
        const [row] = await deps.db
          .insert(units)
          .values({ ...body, createdBy: user!.id })
          .returning();
        res.status(201);
        return { unit: await byId(deps.db, row!.id) };
      } catch (err) {
        if (isUniqueViolation(err)) throw duplicate();
        throw err;
      }
    },
  }),

  defineRoute({
    method: 'get',
    path: '/units/:id',
    access: 'signed-in',
    summary: 'One unit with its photos and every bench run on it',
    params: unitParams,
    handler: async ({ params, deps }) => {
      const unit = await byId(deps.db, params.id);
      const photos = await deps.db
        .select()
        .from(unitPhotos)
        .where(eq(unitPhotos.unitId, params.id))
        .orderBy(asc(unitPhotos.addedAt));
      return {
        unit,
        photos: photos.map((p) => ({
          id: p.id,
          attachmentId: p.attachmentId,
          url: `/api/attachments/${p.attachmentId}`,
          caption: p.caption,
          addedAt: p.addedAt.toISOString(),
        })),
        runs: await unitRuns(deps.db, params.id),
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
      const { lockVersion, ...fields } = body;
      try {
        const [row] = await deps.db
          .update(units)
          .set({ ...fields, lockVersion: sql`${units.lockVersion} + 1`, updatedAt: new Date() })
          .where(and(eq(units.id, params.id), eq(units.lockVersion, lockVersion)))
          .returning();
        if (!row) {
          const current = await byId(deps.db, params.id);
          throw conflict('Someone changed this unit after you opened it; here is the current record.', {
            current,
          });
        }
        return { unit: await byId(deps.db, row.id) };
      } catch (err) {
        if (isUniqueViolation(err)) throw duplicate();
        throw err;
      }
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
      await byId(deps.db, params.id);
      const caption = typeof req.body?.caption === 'string' ? oneLine(req.body.caption, 200) : '';
      const attachment = await storePhoto(deps, req.file, user!.id);
      const [photo] = await deps.db
        .insert(unitPhotos)
        .values({ unitId: params.id, attachmentId: attachment.id, caption, addedBy: user!.id })
        .returning();
      res.status(201);
      return {
        photo: {
          id: photo!.id,
          attachmentId: attachment.id,
          url: `/api/attachments/${attachment.id}`,
          caption,
          addedAt: photo!.addedAt.toISOString(),
        },
      };
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
      await byId(deps.db, params.id);
      return unitTrend(deps.db, params.id, query.reading);
    },
  }),
];
