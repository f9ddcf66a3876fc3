import { describe, expect, it } from 'vitest';
import { BLOCK_ID, validateDocument } from '@shared/document/schema';
import { doc, headlessEditor, para } from '../headless';

const step = (id: string, text: string) => ({ type: 'checkStep', attrs: { id, text } });

describe('unique-ids extension (headless editor)', () => {
  it('a pasted copy of a block gets a fresh id; the original keeps its own', () => {
    const editor = headlessEditor(doc(step('check-one', 'First'), para()));
    editor.commands.insertContentAt(editor.state.doc.content.size, step('check-one', 'Copy'));
    const ids = editor
      .getJSON()
      .content!.filter((n) => n.type === 'checkStep')
      .map((n) => n.attrs?.id);
    expect(ids[0]).toBe('check-one');
    expect(ids[1]).not.toBe('check-one');
    expect(ids[1]).toMatch(BLOCK_ID);
    expect(validateDocument(editor.getJSON())).toMatchObject({ ok: true });
  });

  it('a block with an id the schema refuses gets a valid one on the next change', () => {
    const editor = headlessEditor(doc(step('x', 'Short id'), para()));
    editor.commands.insertContentAt(editor.state.doc.content.size, para('more'));
    expect(editor.getJSON().content?.[0]?.attrs?.id).toMatch(BLOCK_ID);
  });
});
