import type { Editor } from '@tiptap/core';

/** Selects the block with this attrs.id, scrolls it into view and focuses its first control (or `control`). */
export function focusBlock(
  editor: Editor,
  id: string,
  control = 'input:not([type=file]), select, textarea',
): boolean {
  let found: { pos: number; atom: boolean } | null = null;
  editor.state.doc.descendants((node, pos) => {
    if (found) return false;
    if (node.attrs.id === id) found = { pos, atom: node.isAtom };
    return true;
  });
  if (!found) return false;
  const { pos, atom } = found as { pos: number; atom: boolean };
  if (atom) editor.commands.setNodeSelection(pos);
  else editor.commands.setTextSelection(pos + 2);
  const dom = editor.view.dom.querySelector<HTMLElement>(`[data-block-id="${CSS.escape(id)}"]`);
  dom?.scrollIntoView({ block: 'center', behavior: 'smooth' });
  const field = dom?.querySelector<HTMLElement>(control);
  if (atom && field) field.focus({ preventScroll: true });
  else editor.commands.focus();
  return true;
}
