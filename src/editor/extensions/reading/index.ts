import { ReactNodeViewRenderer } from '@tiptap/react';
import { Reading as ReadingNode } from './reading';
import { ReadingView } from './reading-view';

export const Reading = ReadingNode.extend({
  addNodeView() {
    return ReactNodeViewRenderer(ReadingView);
  },
});
export default Reading;
