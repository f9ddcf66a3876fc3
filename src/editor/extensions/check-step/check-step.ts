import { Node } from '@tiptap/core';
import { newBlockId } from '../../block-id';
import { atomBlock } from '../atom-block';
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
  ...atomBlock('check-step'),

  addAttributes() {
    return { id: textAttribute('id'), text: textAttribute('text') };
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
