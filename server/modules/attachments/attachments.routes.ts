import { z } from 'zod';
import { idIn } from '../../http/params';
import type { AttachmentView } from '../../../shared/schemas/procedures';
import { defineRoute } from '../../http/route';
import { readableAttachment, storeUpload } from './attachments.service';
import { attachmentDisposition, cleanFileName, nameForType, receiveFile, type AllowedType } from './upload';

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
    params: z.object({ id: idIn('attachment') }),
    handler: async ({ res, params, user, deps }) => {
      const { row, bytes } = await readableAttachment(deps, user!, params.id);
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
