import { z } from 'zod';
import { blockId, defineNode, esc, shortText } from './define';

export const FILE_MEDIA_TYPES = ['application/pdf', 'image/png', 'image/jpeg', 'image/webp'] as const;

/** A link to an uploaded file (a PDF schematic, a scope capture). */
export const fileAttrs = z
  .object({
    id: blockId,
    attachmentId: z.uuid('not a stored attachment id'),
    fileName: shortText(200),
    mediaType: z.enum(FILE_MEDIA_TYPES),
  })
  .strict();
export type FileAttrs = z.infer<typeof fileAttrs>;

export const file = defineNode({
  attrs: fileAttrs,
  content: 'none',
  label: 'file',
  many: 'files',
  defaults: { id: '', attachmentId: '', fileName: '', mediaType: 'application/pdf' },
  text: (a) => [`File: ${a.fileName}`],
  html: (a) => `<p><a href="/api/attachments/${esc(a.attachmentId)}">${esc(a.fileName)}</a></p>`,
});
