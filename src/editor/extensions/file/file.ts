import { Node } from '@tiptap/core';
import { file, type FileAttrs } from '@shared/document/nodes';
import { atomBlock } from '../atom-block';
import { insertBlock, nodeAttributes } from '../node-attributes';

declare module '@tiptap/core' {
  interface Commands<ReturnType> {
    procedureFile: {
      /** Insert a link to an already-uploaded file (a PDF schematic, a scope capture); false if invalid. */
      insertFile: (attrs: Omit<FileAttrs, 'id'>) => ReturnType;
    };
  }
}

export const FileNode = Node.create({
  name: 'file',
  ...atomBlock('file'),
  addAttributes: () => nodeAttributes(file),
  addCommands() {
    return {
      insertFile: (attrs) => (props) => insertBlock(props, this.name, file, attrs),
    };
  },
});
