import type { RequestHandler } from 'express';
import multer from 'multer';
import type { AppDeps } from '../../deps';
import { attachments } from '../../db/schema';
import { HttpError } from '../../http/errors';
import { cleanFileName, MAX_UPLOAD_BYTES, sniffType, storeFile } from '../../storage/files';

const upload = multer({
  storage: multer.memoryStorage(),
  limits: { fileSize: MAX_UPLOAD_BYTES, files: 1, fields: 5, parts: 6, fieldSize: 2_000 },
});

/** One photo field named "file"; multer's own errors become answers people can act on. */
export const receivePhoto = (): RequestHandler[] => [
  (req, res, next) =>
    upload.single('file')(req, res, (err: unknown) => {
      if (err instanceof multer.MulterError) {
        if (err.code === 'LIMIT_FILE_SIZE') return next(new HttpError(413, `The photo is larger than ${MAX_UPLOAD_BYTES / 1024 / 1024} MB; nothing was stored.`));
        return next(new HttpError(400, `The upload was refused: ${err.message}.`, { fields: [{ field: 'body.file', reason: err.message }] }));
      }
      next(err);
    }),
];

const PHOTO_TYPES = new Set(['image/png', 'image/jpeg', 'image/webp']);

/** Stores a photo judged by its bytes (PNG, JPEG, WebP) under a random name; returns its attachment row. */
export async function storePhoto(deps: AppDeps, file: Express.Multer.File | undefined, uploadedBy: string) {
  if (!file) throw new HttpError(400, 'Choose a photo to upload.', { fields: [{ field: 'body.file', reason: 'required' }] });
  const mediaType = await sniffType(file.buffer);
  if (!mediaType || !PHOTO_TYPES.has(mediaType)) {
    throw new HttpError(415, `“${cleanFileName(file.originalname)}” is not a PNG, JPEG or WebP photo (judged by its content, not its name); nothing was stored.`);
  }
  const stored = await storeFile(deps.config.uploadDir, file.buffer);
  const [row] = await deps.db
    .insert(attachments)
    .values({ ...stored, originalName: cleanFileName(file.originalname), mediaType, size: file.size, uploadedBy })
    .returning();
  return row!;
}
