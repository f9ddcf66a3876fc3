import type { CommandProps, JSONContent } from '@tiptap/core';
import { NodeSelection } from '@tiptap/pm/state';

/**
 * Inserts a block followed by an empty paragraph, so the cursor lands below the new block and the
 * next insert never replaces it. With a block selected, inserts after that block instead of over it.
 */
export function insertBlock({ commands, state }: CommandProps, block: JSONContent): boolean {
  const content = [block, { type: 'paragraph' }];
  if (state.selection instanceof NodeSelection) return commands.insertContentAt(state.selection.to, content);
  return commands.insertContent(content);
}
