import { ReactNodeViewRenderer } from '@tiptap/react';
import { FileNode } from './file';
import { FileView } from './file-view';

export const FileBlock = FileNode.extend({
  addNodeView() {
    return ReactNodeViewRenderer(FileView);
  },
});
export default FileBlock;
