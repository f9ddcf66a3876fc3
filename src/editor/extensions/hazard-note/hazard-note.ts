import { Node, mergeAttributes } from '@tiptap/core';
import type { HazardNoteAttrs } from '@shared/document/schema';
import { newBlockId } from '../../block-id';
import { insertBlock } from '../insert-block';
import { jsonAttribute, textAttribute } from '../json-attr';

declare module '@tiptap/core' {
  interface Commands<ReturnType> {
    hazardNote: {
      /** Insert a hazard note (danger or warning) holding one paragraph of text, with the live-work cautions it states. */
      insertHazardNote: (
        level?: HazardNoteAttrs['level'],
        text?: string,
        flags?: HazardNoteAttrs['flags'],
      ) => ReturnType;
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
    return {
      id: textAttribute('id'),
      level: textAttribute('level', 'danger'),
      // The live-work cautions the note states; null until the author ticks one.
      flags: jsonAttribute<HazardNoteAttrs['flags'] | null>('flags', () => null),
    };
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
        (level = 'danger', text = '', flags) =>
        (props) =>
          insertBlock(props, {
            type: this.name,
            attrs: { id: newBlockId(), level, flags: flags ?? null },
            content: [
              text ? { type: 'paragraph', content: [{ type: 'text', text }] } : { type: 'paragraph' },
            ],
          }),
    };
  },
});
