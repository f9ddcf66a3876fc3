import { Extension } from '@tiptap/core';
import { Plugin, PluginKey } from '@tiptap/pm/state';
import { BLOCK_ID, BLOCK_TYPES } from '@shared/document/nodes';
import { newBlockId } from '../block-id';

const TYPES = new Set<string>(BLOCK_TYPES);

/** Gives every structured block a valid id that no other block uses (paste and duplicate copy ids). */
export const UniqueBlockIds = Extension.create({
  name: 'uniqueBlockIds',
  addProseMirrorPlugins() {
    return [
      new Plugin({
        key: new PluginKey('uniqueBlockIds'),
        appendTransaction: (transactions, _old, state) => {
          if (!transactions.some((t) => t.docChanged)) return null;
          const seen = new Set<string>();
          const tr = state.tr;
          state.doc.descendants((node, pos) => {
            if (!TYPES.has(node.type.name)) return;
            const id = node.attrs.id as unknown;
            if (typeof id === 'string' && BLOCK_ID.test(id) && !seen.has(id)) {
              seen.add(id);
              return;
            }
            const fresh = newBlockId();
            seen.add(fresh);
            tr.setNodeMarkup(pos, undefined, { ...node.attrs, id: fresh });
          });
          return tr.docChanged ? tr.setMeta('addToHistory', false) : null;
        },
      }),
    ];
  },
});
