// The rules every upload follows (procedure attachments, run photos, unit photos): the type is
// judged from the bytes, images are limited in size from their headers, the name is decoded as
// UTF-8, normalised and stripped of characters that hide what it says, and its extension follows
// the detected type. The bytes go to the content-addressed file store.
import type { RequestHandler } from 'express';
import { fileTypeFromBuffer } from 'file-type';
import multer from 'multer';
import { HttpError } from '../../http/errors';
import { imageSize } from './image-size';

/** What may be uploaded, decided from the bytes, never from the name or the client's claim; with the usual extensions. */
const EXTENSIONS = {
  'image/png': ['png'],
  'image/jpeg': ['jpg', 'jpeg'],
  'image/webp': ['webp'],
  'application/pdf': ['pdf'],
} as const;
export type AllowedType = keyof typeof EXTENSIONS;
export const ALLOWED_TYPES = Object.keys(EXTENSIONS) as AllowedType[];
/** What each upload accepts: any attachment of a procedure, or a photo (runs, units). */
const KINDS = {
  file: { types: ALLOWED_TYPES, words: 'a PNG, JPEG, WebP or PDF file' },
  photo: {
    types: ['image/png', 'image/jpeg', 'image/webp'] as AllowedType[],
    words: 'a PNG, JPEG or WebP photo',
  },
};
export type UploadKind = keyof typeof KINDS;
export const MAX_UPLOAD_BYTES = 15 * 1024 * 1024;
/** The longest side an image may have (64 megapixels at most): larger ones are refused, not decoded. */
export const MAX_IMAGE_SIDE = 8000;

export async function sniffType(bytes: Buffer): Promise<AllowedType | null> {
  const found = await fileTypeFromBuffer(bytes);
  return found && found.mime in EXTENSIONS ? (found.mime as AllowedType) : null;
}

const upload = multer({
  storage: multer.memoryStorage(),
  // Browsers send the file name as UTF-8; multer's default would read it as latin1 (Röhre → RÃ¶hre).
  defParamCharset: 'utf8',
  limits: { fileSize: MAX_UPLOAD_BYTES, files: 1, fields: 5, parts: 6, fieldSize: 2_000 },
});

/** One file field named "file"; multer's and the multipart parser's errors become answers people can act on. */
export const receiveFile = (what: UploadKind): RequestHandler[] => [
  (req, res, next) =>
    upload.single('file')(req, res, (err: unknown) => {
      if (!err) return next();
      if (err instanceof multer.MulterError && err.code === 'LIMIT_FILE_SIZE')
        return next(
          new HttpError(
            413,
            `The ${what} is larger than ${MAX_UPLOAD_BYTES / 1024 / 1024} MB; nothing was stored.`,
          ),
        );
      // The rest are malformed requests (busboy: "Malformed part header", "Unexpected end of form").
      const reason = err instanceof Error ? err.message : 'unreadable multipart body';
      next(
        new HttpError(400, `The upload was refused: ${reason}.`, {
          fields: [{ field: 'body.file', reason }],
        }),
      );
    }),
];

// Control characters (C0, DEL, C1) and the bidi controls that reorder how a name is shown
// (Unicode UAX #9: LRM, RLM, ALM, embeddings, overrides and isolates).
// eslint-disable-next-line no-control-regex -- control characters are what this matches
const HIDING = /[\u0000-\u001f\u007f-\u009f\u061c\u200e\u200f\u202a-\u202e\u2066-\u2069]/g;

/** A display name safe for headers and pages: NFC, no path, no control or bidi characters, bounded. */
export function cleanFileName(name: string) {
  const base = name.normalize('NFC').split(/[\\/]/).pop() ?? '';
  const clean = base.replace(HIDING, '').replace(/"/g, '').trim();
  return Array.from(clean).slice(0, 200).join('') || 'file';
}

/** The name with the extension of its detected type: a PNG named evil.html becomes evil.png. */
export function nameForType(name: string, mediaType: AllowedType) {
  const dot = name.lastIndexOf('.');
  const ext = dot > 0 ? name.slice(dot + 1) : '';
  if ((EXTENSIONS[mediaType] as readonly string[]).includes(ext.toLowerCase())) return name;
  const stem = /^[A-Za-z0-9]{1,10}$/.test(ext) ? name.slice(0, dot) : name;
  return `${stem}.${EXTENSIONS[mediaType][0]}`;
}

/** Content-Disposition for a download: an ASCII fallback and the exact name in RFC 5987 form (RFC 6266 §4.3). */
export function attachmentDisposition(name: string) {
  const fallback = name.replace(/[^\x20-\x7e]|["\\]/g, '_');
  const exact = encodeURIComponent(name).replace(
    /['()*]/g,
    (c) => `%${c.charCodeAt(0).toString(16).toUpperCase()}`,
  );
  return `attachment; filename="${fallback}"; filename*=UTF-8''${exact}`;
}

const refused = (reason: string, message: string) =>
  new HttpError(400, message, { fields: [{ field: 'body.file', reason }] });

/** Checks an uploaded file against the rules; answers its type (from the bytes) and the name to keep. */
export async function checkUpload(file: Express.Multer.File | undefined, what: UploadKind) {
  if (!file)
    throw new HttpError(400, `Choose a ${what} to upload.`, {
      fields: [{ field: 'body.file', reason: 'required' }],
    });
  const mediaType = await sniffType(file.buffer);
  const shown = cleanFileName(file.originalname);
  if (!mediaType || !KINDS[what].types.includes(mediaType)) {
    throw new HttpError(
      415,
      `“${shown}” is not ${KINDS[what].words} (judged by its content, not its name); nothing was stored.`,
    );
  }
  if (mediaType !== 'application/pdf') {
    const size = imageSize(file.buffer, mediaType);
    if (!size)
      throw refused(
        'the image size could not be read from its header',
        `“${shown}” looks like ${mediaType} but its size cannot be read; nothing was stored.`,
      );
    if (size.width > MAX_IMAGE_SIDE || size.height > MAX_IMAGE_SIDE) {
      const reason = `image is ${size.width} × ${size.height} px; the limit is ${MAX_IMAGE_SIDE} × ${MAX_IMAGE_SIDE} px`;
      throw refused(
        reason,
        `“${shown}” is ${size.width} × ${size.height} px; images may be at most ${MAX_IMAGE_SIDE} × ${MAX_IMAGE_SIDE} px. Nothing was stored.`,
      );
    }
  }
  return { file, mediaType, name: nameForType(shown, mediaType) };
}
