import { Node } from '@tiptap/core';
import { reading, type ReadingAttrs } from '@shared/document/nodes';
import { atomBlock } from '../atom-block';
import { insertBlock, nodeAttributes } from '../node-attributes';

declare module '@tiptap/core' {
  interface Commands<ReturnType> {
    reading: {
      /** Insert a reading (volts DC, ±10 %, literal expected value unless `attrs` says otherwise); false if invalid. */
      insertReading: (attrs?: Partial<Omit<ReadingAttrs, 'id'>>) => ReturnType;
    };
  }
}

/** A measurement step; its attributes are the reading node module's. */
export const Reading = Node.create({
  name: 'reading',
  ...atomBlock('reading'),
  addAttributes: () => nodeAttributes(reading),
  addCommands() {
    return {
      insertReading:
        (attrs = {}) =>
        (props) =>
          insertBlock(props, this.name, reading, attrs),
    };
  },
});
