import type { CommandProps, JSONContent } from '@tiptap/core';
import { NodeSelection, TextSelection } from '@tiptap/pm/state';
import type { NodeDef } from '@shared/document/nodes';
import { newBlockId } from '../block-id';
import { jsonAttribute, textAttribute } from './json-attr';

/**
 * A node's TipTap attributes, declared from its defaults in the node module: a string default is
 * kept in HTML as text (`data-test-point`), anything else as JSON (`data-expected`).
 */
export function nodeAttributes(def: NodeDef) {
  return Object.fromEntries(
    Object.entries(def.defaults ?? {}).map(([key, value]) => [
      key,
      typeof value === 'string'
        ? textAttribute(key, value)
        : jsonAttribute(key, () => structuredClone(value)),
    ]),
  );
}

/** Where the selection goes after an insert: into the block's text, onto the block, or below it. */
export type LandOn = 'inside' | 'block' | 'after';

/**
 * Inserts a block of a node module's type, followed by an empty paragraph so the next insert never
 * replaces it; with a block selected, after that block instead of over it. The attributes are the
 * module's defaults, its new-block values and `attrs`, checked against its schema: an invalid block
 * is not inserted (false).
 */
export function insertBlock(
  { commands, state, tr }: CommandProps,
  type: string,
  def: NodeDef,
  attrs: Record<string, unknown> = {},
  { content, land = 'after' }: { content?: JSONContent[]; land?: LandOn } = {},
): boolean {
  const full = { ...def.defaults, ...def.inserted, id: newBlockId(), ...attrs };
  if (def.attrs && !def.attrs.safeParse(full).success) return false;
  const nodes = [{ type, attrs: full, ...(content ? { content } : {}) }, { type: 'paragraph' }];
  const ok =
    state.selection instanceof NodeSelection
      ? commands.insertContentAt(state.selection.to, nodes)
      : commands.insertContent(nodes);
  if (!ok || land === 'after') return ok;
  let at = -1;
  let end = -1;
  tr.doc.descendants((n, pos) => {
    if (at < 0 && n.attrs.id === full.id) [at, end] = [pos, pos + n.nodeSize - 1];
    return at < 0;
  });
  if (at < 0) return ok;
  // Inside: at the end of the block's text, where typing goes on from what was given.
  tr.setSelection(
    land === 'block' ? NodeSelection.create(tr.doc, at) : TextSelection.near(tr.doc.resolve(end), -1),
  );
  return ok;
}
