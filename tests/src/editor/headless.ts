/**
 * The procedure editor without a browser: TipTap's Editor runs headless (no DOM, no node views),
 * with exactly the extensions the page uses.
 */
import { Editor, type JSONContent } from '@tiptap/core';
import { vi } from 'vitest';
import { procedureExtensions } from '@/editor/extensions';

// The keyboard shortcuts ask the platform (Mac or not); Node 20 has no navigator.
if (typeof navigator === 'undefined')
  vi.stubGlobal('navigator', { platform: 'Linux x86_64', userAgent: 'node' });

export const doc = (...content: JSONContent[]): JSONContent => ({ type: 'doc', content });
export const para = (text?: string): JSONContent =>
  text ? { type: 'paragraph', content: [{ type: 'text', text }] } : { type: 'paragraph' };

export function headlessEditor(content: JSONContent = doc(para()), onOpenMenu = () => {}): Editor {
  const editor = new Editor({ extensions: procedureExtensions(onOpenMenu), content });
  // Without a view TipTap leaves the extensions' plugins out of the state; mounting would add them.
  editor.view.updateState(editor.state.reconfigure({ plugins: editor.extensionManager.plugins }));
  return editor;
}

/** The editor's JSON after loading it back: getJSON → setContent → getJSON. */
export function reloaded(editor: Editor): JSONContent {
  const again = headlessEditor();
  again.commands.setContent(editor.getJSON());
  return again.getJSON();
}

/** The top-level node of `type`, with its position, or undefined. */
export function findNode(editor: Editor, type: string) {
  let found: { pos: number; attrs: Record<string, unknown> } | undefined;
  editor.state.doc.forEach((node, pos) => {
    if (!found && node.type.name === type) found = { pos, attrs: { ...node.attrs } };
  });
  return found;
}

/**
 * A node's attributes as copied to HTML and pasted back: each attribute's renderHTML writes data-*
 * attributes, parseHTML reads them from an element holding just those.
 */
export function throughHtml(editor: Editor, type: string, attrs: Record<string, unknown>) {
  const declared = editor.extensionManager.attributes.filter((a) => a.type === type);
  const data: Record<string, string> = {};
  for (const a of declared) Object.assign(data, a.attribute.renderHTML?.(attrs) ?? {});
  const element = { getAttribute: (name: string) => data[name] ?? null } as unknown as HTMLElement;
  return Object.fromEntries(declared.map((a) => [a.name, a.attribute.parseHTML?.(element)]));
}
