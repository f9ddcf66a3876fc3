import { Node } from '@tiptap/core';
import { image } from '@shared/document/nodes';
import { atomBlock } from '../atom-block';
import { insertBlock, nodeAttributes } from '../node-attributes';

declare module '@tiptap/core' {
  interface Commands<ReturnType> {
    procedureImage: {
      /** Insert an already-uploaded image by its attachment id; false if invalid. */
      insertImage: (attrs: { attachmentId: string; alt?: string; caption?: string }) => ReturnType;
    };
  }
}

/** An uploaded photo or drawing; the document keeps the attachment id, never the bytes or a URL. */
export const ImageNode = Node.create({
  name: 'image',
  ...atomBlock('image', 'figure'),
  addAttributes: () => nodeAttributes(image),
  addCommands() {
    return {
      insertImage: (attrs) => (props) => insertBlock(props, this.name, image, attrs),
    };
  },
});
