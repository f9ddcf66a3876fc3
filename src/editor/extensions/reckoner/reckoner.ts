import { Node } from '@tiptap/core';
import { reckoner, type InputValue } from '@shared/document/nodes';
import { getReckoner, type FieldSpec } from '@shared/reckoners';
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

/** Starting inputs for a field list: defaults as text, one empty row in row tables, declared parameters followed. */
export function initialInputs(fields: FieldSpec[]): Record<string, InputValue> {
  const inputs: Record<string, InputValue> = {};
  for (const f of fields) {
    if (f.kind === 'rows') {
      const row = initialInputs(f.columns ?? []);
      inputs[f.key] = Array.from({ length: Math.max(1, f.minRows ?? 0) }, () => ({ ...row }));
    } else if (f.follows) {
      inputs[f.key] = { param: f.follows };
    } else if (f.default !== undefined && (typeof f.default === 'string' || typeof f.default === 'number')) {
      inputs[f.key] = typeof f.default === 'string' ? f.default : String(f.default);
    } else {
      inputs[f.key] = '';
    }
  }
  return inputs;
}

/** A short block name not yet used in the document ("fuse", "fuse2", …). */
export function freshName(kind: string, taken: Set<string>): string {
  const base = kind
    .split('-')
    .map((w, i) => (i ? w[0]!.toUpperCase() + w.slice(1) : w))
    .join('')
    .slice(0, 28);
  if (!taken.has(base)) return base;
  for (let i = 2; ; i++) if (!taken.has(`${base}${i}`)) return `${base}${i}`;
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
