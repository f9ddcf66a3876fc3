import { eq } from 'drizzle-orm';
import multer from 'multer';
import { z } from 'zod';
import type { AttachmentView } from '../../../shared/schemas/procedures';
import { attachments } from '../../db/schema';
import { HttpError, notFound } from '../../http/errors';
import { defineRoute } from '../../http/route';
import { ALLOWED_TYPES, cleanFileName, MAX_UPLOAD_BYTES, readStoredFile, sniffType, storeFile } from '../../storage/files';

const upload = multer({
  storage: multer.memoryStorage(),
  limits: { fileSize: MAX_UPLOAD_BYTES, files: 1, fields: 5, parts: 6 },
});

/** multer's own errors, turned into answers people can act on. */
const receiveOne = () => [
  (req: Parameters<ReturnType<typeof upload.single>>[0], res: Parameters<ReturnType<typeof upload.single>>[1], next: (err?: unknown) => void) =>
    upload.single('file')(req, res, (err: unknown) => {
      if (err instanceof multer.MulterError) {
        if (err.code === 'LIMIT_FILE_SIZE') return next(new HttpError(413, `The file is larger than ${MAX_UPLOAD_BYTES / 1024 / 1024} MB; nothing was stored.`));
        return next(new HttpError(400, `The upload was refused: ${err.message}.`, { fields: [{ field: 'body.file', reason: err.message }] }));
      }
      next(err);
    }),
];

export const attachmentRoutes = [
  defineRoute({
    method: 'post',
    path: '/attachments',
    access: ['author'],
    summary: 'Upload a photo, schematic (PDF) or scope capture (PNG, JPEG, WebP, PDF; 15 MB)',
    before: receiveOne,
    handler: async ({ req, res, user, deps }) => {
      const file = req.file;
      if (!file) throw new HttpError(400, 'Choose a file to upload.', { fields: [{ field: 'body.file', reason: 'required' }] });
      const mediaType = await sniffType(file.buffer);
      if (!mediaType) {
        throw new HttpError(415, `“${cleanFileName(file.originalname)}” is not a PNG, JPEG, WebP or PDF file (judged by its content, not its name); nothing was stored.`);
      }
      const stored = await storeFile(deps.config.uploadDir, file.buffer);
      const [row] = await deps.db
        .insert(attachments)
        .values({ ...stored, originalName: cleanFileName(file.originalname), mediaType, size: file.size, uploadedBy: user!.id })
        .returning();
      res.status(201);
      const view: AttachmentView = { id: row!.id, fileName: row!.originalName, mediaType, size: row!.size, url: `/api/attachments/${row!.id}` };
      return { attachment: view };
    },
  }),

  defineRoute({
    method: 'get',
    path: '/attachments/:id',
    access: 'signed-in',
    summary: 'Download an attachment (served as an attachment, sandboxed, never sniffed)',
    params: z.object({ id: z.uuid('not a valid attachment id') }),
    handler: async ({ res, params, deps }) => {
      const [row] = await deps.db.select().from(attachments).where(eq(attachments.id, params.id));
      if (!row || !(ALLOWED_TYPES as readonly string[]).includes(row.mediaType)) throw notFound('No such attachment.');
      const bytes = await readStoredFile(deps.config.uploadDir, row.storedName);
      res.set({
        'Content-Type': row.mediaType,
        'Content-Length': String(bytes.length),
        'X-Content-Type-Options': 'nosniff',
        'Content-Security-Policy': "default-src 'none'; sandbox",
        'Content-Disposition': `attachment; filename="${row.originalName.replace(/[^\x20-\x7e]/g, '_')}"; filename*=UTF-8''${encodeURIComponent(row.originalName)}`,
        'Cache-Control': 'private, max-age=3600',
      });
      res.end(bytes);
    },
  }),
];
