import { Node } from '@tiptap/core';
import { checkStep, type CheckStepAttrs } from '@shared/document/nodes';
import { atomBlock } from '../atom-block';
import { insertBlock, nodeAttributes } from '../node-attributes';

declare module '@tiptap/core' {
  interface Commands<ReturnType> {
    checkStep: {
      /**
       * Insert a step the technician must confirm by ticking it: a plain confirmation unless `attrs`
       * says otherwise; false if invalid. The new step is selected, so its text can be written next.
       */
      insertCheckStep: (text?: string, attrs?: Partial<Omit<CheckStepAttrs, 'id' | 'text'>>) => ReturnType;
    };
  }
}

/** The default threshold of a new discharge-verified step: the shop's safe voltage (IEC 62368-1 ES1, IEC 60204-1 6.2.4). */
export const DEFAULT_DISCHARGE_THRESHOLD = '60 V';

export const CheckStep = Node.create({
  name: 'checkStep',
  ...atomBlock('checkStep'),
  addAttributes: () => nodeAttributes(checkStep),
  addCommands() {
    return {
      insertCheckStep:
        (text = '', attrs = {}) =>
        (props) =>
          insertBlock(props, this.name, checkStep, { ...attrs, text }, { land: 'block' }),
    };
  },
});
