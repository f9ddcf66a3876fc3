import { ReactNodeViewRenderer } from '@tiptap/react';
import { HazardNote as HazardNoteNode } from './hazard-note';
import { HazardNoteView } from './hazard-note-view';

export const HazardNote = HazardNoteNode.extend({
  addNodeView() {
    return ReactNodeViewRenderer(HazardNoteView);
  },
});
export default HazardNote;
