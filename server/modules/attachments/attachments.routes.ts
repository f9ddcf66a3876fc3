import { eq, sql } from 'drizzle-orm';
import { z } from 'zod';
import type { AttachmentView } from '../../../shared/schemas/procedures';
import type { Db } from '../../db/client';
import { attachments } from '../../db/schema';
import { notFound } from '../../http/errors';
import { defineRoute, type SessionUser } from '../../http/route';
import { PUBLISHED_STATES, seesDrafts } from '../procedures/procedures.service';
import {
  ALLOWED_TYPES,
  attachmentDisposition,
  cleanFileName,
  nameForType,
  receiveFile,
  storeUpload,
  type AllowedType,
} from './upload';

/**
 * Whether this person may read the attachment: staff read every one (as they read every draft);
 * technicians only what a published revision shows, and run and unit photos.
 */
async function mayRead(db: Db, user: SessionUser, id: string) {
  if (seesDrafts(user)) return true;
  const published = sql.raw(PUBLISHED_STATES.map((s) => `'${s}'`).join(', '));
  const { rows } = await db.execute<{ ok: boolean }>(sql`
    select exists (select 1 from run_photos where attachment_id = ${id})
        or exists (select 1 from unit_photos where attachment_id = ${id})
        or exists (
             select 1 from revisions
             where state in (${published})
               and jsonb_path_exists(document, '$.** ? (@.attachmentId == $id)', jsonb_build_object('id', ${id}::text))
           ) as ok`);
  return rows[0]?.ok === true;
}

export const attachmentRoutes = [
  defineRoute({
    method: 'post',
    path: '/attachments',
    access: ['author'],
    summary:
      'Upload a photo, schematic (PDF) or scope capture (PNG, JPEG, WebP, PDF; 15 MB; images up to 8000 × 8000 px)',
    before: () => receiveFile('file'),
    handler: async ({ req, res, user, deps }) => {
      const row = await storeUpload(deps, req.file, user!.id, 'file');
      res.status(201);
      const view: AttachmentView = {
        id: row.id,
        fileName: row.originalName,
        mediaType: row.mediaType as AllowedType,
        size: row.size,
        url: `/api/attachments/${row.id}`,
      };
      return { attachment: view };
    },
  }),

  defineRoute({
    method: 'get',
    path: '/attachments/:id',
    access: 'signed-in',
    summary:
      'Download an attachment one may read (a draft’s only by staff), its bytes checked against their SHA-256; served as an attachment, sandboxed, never sniffed',
    params: z.object({ id: z.uuid('not a valid attachment id') }),
    handler: async ({ res, params, user, deps }) => {
      const [row] = await deps.db.select().from(attachments).where(eq(attachments.id, params.id));
      if (
        !row ||
        !(ALLOWED_TYPES as string[]).includes(row.mediaType) ||
        !(await mayRead(deps.db, user!, row.id))
      )
        throw notFound('No such attachment.');
      const bytes = await deps.files.get(row.sha256);
      if (!bytes)
        throw notFound(
          'The stored file does not match this attachment’s recorded SHA-256 (missing or altered); tell an admin.',
        );
      res.set({
        'Content-Type': row.mediaType,
        'Content-Length': String(bytes.length),
        'X-Content-Type-Options': 'nosniff',
        'Content-Security-Policy': "default-src 'none'; sandbox",
        // Names stored before these rules are cleaned here too.
        'Content-Disposition': attachmentDisposition(
          nameForType(cleanFileName(row.originalName), row.mediaType as AllowedType),
        ),
        'Cache-Control': 'private, max-age=3600',
      });
      res.end(bytes);
    },
  }),
];
