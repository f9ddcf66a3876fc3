import { mergeAttributes } from '@tiptap/core';

/** A node's name in copied HTML: `<div data-type="check-step">` for checkStep. */
export const htmlName = (type: string) => type.replace(/[A-Z]/g, (c) => `-${c.toLowerCase()}`);

/**
 * What every self-contained block of a procedure (reckoner, reading, check step, image, file) shares:
 * block-level, atomic, draggable, and stored in HTML as `<tag data-type="…">`.
 */
export function atomBlock(nodeType: string, tag = 'div') {
  const type = htmlName(nodeType);
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
