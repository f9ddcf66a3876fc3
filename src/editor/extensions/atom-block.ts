import { mergeAttributes } from '@tiptap/core';

/**
 * What every self-contained block of a procedure (reckoner, reading, check step, image, file) shares:
 * block-level, atomic, draggable, and stored in HTML as `<tag data-type="…">`.
 */
export function atomBlock(type: string, tag = 'div') {
  return {
    group: 'block',
    atom: true,
    draggable: true,
    selectable: true,
    parseHTML: () => [{ tag: `${tag}[data-type="${type}"]` }],
    renderHTML: ({ HTMLAttributes }: { HTMLAttributes: Record<string, unknown> }) =>
      [tag, mergeAttributes(HTMLAttributes, { 'data-type': type })] as [string, Record<string, unknown>],
  };
}
