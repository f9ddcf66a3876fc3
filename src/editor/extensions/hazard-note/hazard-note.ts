import { Node, mergeAttributes } from '@tiptap/core';
import { hazardNote, type HazardNoteAttrs } from '@shared/document/nodes';
import { htmlName } from '../atom-block';
import { insertBlock, nodeAttributes } from '../node-attributes';

declare module '@tiptap/core' {
  interface Commands<ReturnType> {
    hazardNote: {
      /**
       * Insert a hazard note (danger or warning) holding one paragraph of text, with the live-work
       * cautions it states; false if invalid. The cursor lands in the note's text.
       */
      insertHazardNote: (
        level?: HazardNoteAttrs['level'],
        text?: string,
        flags?: HazardNoteAttrs['flags'],
      ) => ReturnType;
    };
  }
}

const dataType = htmlName('hazardNote');

/** A caution block in safety colours; its content is paragraphs only. */
export const HazardNote = Node.create({
  name: 'hazardNote',
  group: 'block',
  content: 'paragraph+',
  defining: true,
  draggable: true,
  addAttributes: () => nodeAttributes(hazardNote),
  parseHTML: () => [{ tag: `div[data-type="${dataType}"]` }],
  renderHTML: ({ HTMLAttributes }) => ['div', mergeAttributes(HTMLAttributes, { 'data-type': dataType }), 0],
  addCommands() {
    return {
      insertHazardNote:
        (level = 'danger', text = '', flags) =>
        (props) =>
          insertBlock(
            props,
            this.name,
            hazardNote,
            { level, flags: flags ?? null },
            {
              content: [
                text ? { type: 'paragraph', content: [{ type: 'text', text }] } : { type: 'paragraph' },
              ],
              land: 'inside',
            },
          ),
    };
  },
});
