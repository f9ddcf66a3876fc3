import { Node } from '@tiptap/core';
import type { FileAttrs } from '@shared/document/schema';
import { newBlockId } from '../../block-id';
import { atomBlock } from '../atom-block';
import { insertBlock } from '../insert-block';
import { textAttribute } from '../json-attr';

declare module '@tiptap/core' {
  interface Commands<ReturnType> {
    procedureFile: {
      /** Insert a link to an already-uploaded file (a PDF schematic, a scope capture). */
      insertFile: (attrs: Omit<FileAttrs, 'id'>) => ReturnType;
    };
  }
}

export const FileNode = Node.create({
  name: 'file',
  ...atomBlock('file'),

  addAttributes() {
    return {
      id: textAttribute('id'),
      attachmentId: textAttribute('attachment-id'),
      fileName: textAttribute('file-name'),
      mediaType: textAttribute('media-type', 'application/pdf'),
    };
  },

  addCommands() {
    return {
      insertFile: (attrs) => (props) =>
        insertBlock(props, { type: this.name, attrs: { id: newBlockId(), ...attrs } }),
    };
  },
});
