import { Node } from '@tiptap/core';
import type { ReadingAttrs } from '@shared/document/schema';
import { newBlockId } from '../../block-id';
import { atomBlock } from '../atom-block';
import { insertBlock } from '../insert-block';
import { jsonAttribute, textAttribute } from '../json-attr';

declare module '@tiptap/core' {
  interface Commands<ReturnType> {
    reading: {
      /** Insert an empty reading (volts, literal expected value). */
      insertReading: (attrs?: Partial<Omit<ReadingAttrs, 'id'>>) => ReturnType;
    };
  }
}

/** A measurement step: what, where, meter range, unit, expected value and tolerance. */
export const Reading = Node.create({
  name: 'reading',
  ...atomBlock('reading'),

  addAttributes() {
    return {
      id: textAttribute('id'),
      label: textAttribute('label'),
      testPoint: textAttribute('test-point'),
      meterRange: textAttribute('meter-range'),
      unit: textAttribute('unit', 'V'),
      measure: jsonAttribute<ReadingAttrs['measure']>('measure', () => null),
      expected: jsonAttribute<ReadingAttrs['expected']>('expected', () => ({ literal: '' })),
      followsMains: jsonAttribute<ReadingAttrs['followsMains']>('follows-mains', () => null),
      tolerance: textAttribute('tolerance'),
      // Null: live by its unit (V, A, W, Hz); true or false as the author marks it.
      live: jsonAttribute<ReadingAttrs['live'] | null>('live', () => null),
    };
  },

  addCommands() {
    return {
      insertReading:
        (attrs = {}) =>
        (props) => {
          const full: ReadingAttrs = {
            id: newBlockId(),
            label: '',
            testPoint: '',
            meterRange: '',
            unit: 'V',
            measure: 'dc',
            expected: { literal: '' },
            tolerance: '±10 %',
            ...attrs,
          };
          return insertBlock(props, { type: this.name, attrs: full });
        },
    };
  },
});
