import { Node } from '@tiptap/core';
import type { CheckStepAttrs } from '@shared/document/schema';
import { newBlockId } from '../../block-id';
import { atomBlock } from '../atom-block';
import { insertBlock } from '../insert-block';
import { jsonAttribute, textAttribute } from '../json-attr';

declare module '@tiptap/core' {
  interface Commands<ReturnType> {
    checkStep: {
      /** Insert a step the technician must confirm by ticking it: a plain confirmation unless `attrs` says otherwise. */
      insertCheckStep: (text?: string, attrs?: Partial<Omit<CheckStepAttrs, 'id' | 'text'>>) => ReturnType;
    };
  }
}

/** The default threshold of a new discharge-verified step: the shop's safe voltage (IEC 62368-1 ES1, IEC 60204-1 6.2.4). */
export const DEFAULT_DISCHARGE_THRESHOLD = '60 V';

export const CheckStep = Node.create({
  name: 'checkStep',
  ...atomBlock('check-step'),

  addAttributes() {
    // Unset structured attributes stay null; the document schema reads null as "not stated".
    return {
      id: textAttribute('id'),
      text: textAttribute('text'),
      kind: jsonAttribute<CheckStepAttrs['kind'] | null>('kind', () => null),
      threshold: jsonAttribute<CheckStepAttrs['threshold'] | null>('threshold', () => null),
      seconds: jsonAttribute<CheckStepAttrs['seconds'] | null>('seconds', () => null),
      drain: jsonAttribute<CheckStepAttrs['drain'] | null>('drain', () => null),
      live: jsonAttribute<CheckStepAttrs['live'] | null>('live', () => null),
    };
  },

  addCommands() {
    return {
      insertCheckStep:
        (text = '', attrs = {}) =>
        (props) =>
          insertBlock(props, { type: this.name, attrs: { id: newBlockId(), text, ...attrs } }),
    };
  },
});
