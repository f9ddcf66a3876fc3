import { ReactNodeViewRenderer } from '@tiptap/react';
import { Reckoner as ReckonerNode } from './reckoner';
import { ReckonerView } from './reckoner-view';

export const Reckoner = ReckonerNode.extend({
  addNodeView() {
    return ReactNodeViewRenderer(ReckonerView);
  },
});
export default Reckoner;
