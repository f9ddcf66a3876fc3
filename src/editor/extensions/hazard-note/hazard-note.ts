import { Node, mergeAttributes } from '@tiptap/core';
import type { HazardNoteAttrs } from '@shared/document/schema';
import { newBlockId } from '../../block-id';
import { insertBlock } from '../insert-block';
import { textAttribute } from '../json-attr';

declare module '@tiptap/core' {
  interface Commands<ReturnType> {
    hazardNote: {
      /** Insert a hazard note (danger or warning) holding one paragraph of text. */
      insertHazardNote: (level?: HazardNoteAttrs['level'], text?: string) => ReturnType;
    };
  }
}

/** A caution block in safety colours; its content is paragraphs only. */
export const HazardNote = Node.create({
  name: 'hazardNote',
  group: 'block',
  content: 'paragraph+',
  defining: true,
  draggable: true,

  addAttributes() {
    return { id: textAttribute('id'), level: textAttribute('level', 'danger') };
  },

  parseHTML() {
    return [{ tag: 'div[data-type="hazard-note"]' }];
  },

  renderHTML({ HTMLAttributes }) {
    return ['div', mergeAttributes(HTMLAttributes, { 'data-type': 'hazard-note' }), 0];
  },

  addCommands() {
    return {
      insertHazardNote:
        (level = 'danger', text = '') =>
        (props) =>
          insertBlock(props, {
            type: this.name,
            attrs: { id: newBlockId(), level },
            content: [text ? { type: 'paragraph', content: [{ type: 'text', text }] } : { type: 'paragraph' }],
          }),
    };
  },
});
