import { Node } from '@tiptap/core';
import { reckoner } from '@shared/document/nodes';
import { getReckoner } from '@shared/reckoners';
import { freshName, initialInputs } from '@shared/reckoners/initial-inputs';
import { atomBlock } from '../atom-block';
import { insertBlock, nodeAttributes } from '../node-attributes';

declare module '@tiptap/core' {
  interface Commands<ReturnType> {
    reckoner: {
      /** Insert a reckoner of a registry kind with a fresh name and its default inputs; false for an unknown kind. */
      insertReckoner: (kind: string) => ReturnType;
    };
  }
}

/** A live calculation block: kind, name, inputs; outputs are computed, never stored in the node. */
export const Reckoner = Node.create({
  name: 'reckoner',
  ...atomBlock('reckoner'),

  addAttributes: () => nodeAttributes(reckoner),

  addCommands() {
    return {
      insertReckoner: (kind) => (props) => {
        const { state } = props;
        const def = getReckoner(kind);
        if (!def) return false;
        const taken = new Set<string>();
        state.doc.descendants((n) => {
          if (n.type.name === 'reckoner') taken.add(String(n.attrs.name));
        });
        const attrs = { name: freshName(kind, taken), kind, inputs: initialInputs(def.fields) };
        return insertBlock(props, this.name, reckoner, attrs);
      },
    };
  },
});
