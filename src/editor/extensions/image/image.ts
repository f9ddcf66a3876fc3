import { Node } from '@tiptap/core';
import type { ImageAttrs } from '@shared/document/schema';
import { newBlockId } from '../../block-id';
import { atomBlock } from '../atom-block';
import { insertBlock } from '../insert-block';
import { textAttribute } from '../json-attr';

declare module '@tiptap/core' {
  interface Commands<ReturnType> {
    procedureImage: {
      /** Insert an already-uploaded image by its attachment id. */
      insertImage: (attrs: { attachmentId: string; alt?: string; caption?: string }) => ReturnType;
    };
  }
}

/** An uploaded photo or drawing; the document keeps the attachment id, never the bytes or a URL. */
export const ImageNode = Node.create({
  name: 'image',
  ...atomBlock('image', 'figure'),

  addAttributes() {
    return {
      id: textAttribute('id'),
      attachmentId: textAttribute('attachment-id'),
      alt: textAttribute('alt'),
      caption: textAttribute('caption'),
    };
  },

  addCommands() {
    return {
      insertImage:
        ({ attachmentId, alt = '', caption = '' }) =>
        (props) => {
          const attrs: ImageAttrs = { id: newBlockId(), attachmentId, alt, caption };
          return insertBlock(props, { type: this.name, attrs });
        },
    };
  },
});
