import { Node, mergeAttributes } from '@tiptap/core';
import { newBlockId } from '../../block-id';
import { insertBlock } from '../insert-block';
import { textAttribute } from '../json-attr';

declare module '@tiptap/core' {
  interface Commands<ReturnType> {
    checkStep: {
      /** Insert a step the technician must confirm by ticking it. */
      insertCheckStep: (text?: string) => ReturnType;
    };
  }
}

export const CheckStep = Node.create({
  name: 'checkStep',
  group: 'block',
  atom: true,
  draggable: true,
  selectable: true,

  addAttributes() {
    return { id: textAttribute('id'), text: textAttribute('text') };
  },

  parseHTML() {
    return [{ tag: 'div[data-type="check-step"]' }];
  },

  renderHTML({ HTMLAttributes }) {
    return ['div', mergeAttributes(HTMLAttributes, { 'data-type': 'check-step' })];
  },

  addCommands() {
    return {
      insertCheckStep:
        (text = '') =>
        (props) =>
          insertBlock(props, { type: this.name, attrs: { id: newBlockId(), text } }),
    };
  },
});
