import { z } from 'zod';
import { blockId, defineNode, esc, shortText } from './define';

/** An uploaded photo or drawing; the document keeps the attachment id, never the bytes or a URL. */
export const imageAttrs = z
  .object({
    id: blockId,
    attachmentId: z.uuid('not a stored attachment id'),
    alt: shortText(300),
    caption: shortText(300),
  })
  .strict();
export type ImageAttrs = z.infer<typeof imageAttrs>;

export const image = defineNode({
  attrs: imageAttrs,
  content: 'none',
  label: 'image',
  many: 'images',
  defaults: { id: '', attachmentId: '', alt: '', caption: '' },
  text: (a) => [`Image: ${a.caption || a.alt}`],
  html: (a) =>
    `<figure><img src="/api/attachments/${esc(a.attachmentId)}" alt="${esc(a.alt)}"><figcaption>${esc(a.caption)}</figcaption></figure>`,
});
