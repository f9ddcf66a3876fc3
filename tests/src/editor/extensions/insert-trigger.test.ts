import type { EditorView } from '@tiptap/pm/view';
import { TextSelection } from '@tiptap/pm/state';
import { describe, expect, it, vi } from 'vitest';
import { doc, headlessEditor, para } from '../headless';

/** Offers "/" typed at the cursor to the editor's text-input handlers, as a browser would. */
function typeSlash(editor: ReturnType<typeof headlessEditor>): boolean {
  const { from, to } = editor.state.selection;
  const view = { state: editor.state } as EditorView;
  const insertSlash = () => editor.state.tr.insertText('/', from, to);
  return editor.state.plugins.some((p) => p.props.handleTextInput?.call(p, view, from, to, '/', insertSlash));
}

describe('insert-trigger extension (headless editor)', () => {
  it('"/" in an empty paragraph opens the block list instead of typing', () => {
    const onOpen = vi.fn();
    const editor = headlessEditor(doc(para()), onOpen);
    expect(typeSlash(editor)).toBe(true);
    expect(onOpen).toHaveBeenCalledTimes(1);
  });

  it('"/" inside text is just a slash', () => {
    const onOpen = vi.fn();
    const editor = headlessEditor(doc(para('6.3 V')), onOpen);
    editor.view.dispatch(editor.state.tr.setSelection(TextSelection.create(editor.state.doc, 6)));
    expect(typeSlash(editor)).toBe(false);
    expect(onOpen).not.toHaveBeenCalled();
  });
});
