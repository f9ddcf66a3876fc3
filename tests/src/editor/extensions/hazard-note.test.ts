import { TextSelection } from '@tiptap/pm/state';
import { describe, expect, it } from 'vitest';
import { validateDocument } from '@shared/document/schema';
import { hazardNote } from '@shared/document/nodes';
import { doc, headlessEditor, para, reloaded, throughHtml } from '../headless';

// Every attribute the node module declares, so one it gains is round-tripped too.
const note = {
  ...hazardNote.defaults,
  id: 'hazard-1a',
  level: 'warning',
  flags: { oneHand: true, isolation: true },
};

describe('hazard-note extension (headless editor)', () => {
  it('insertHazardNote puts the cursor in the new note, where typing writes its text', () => {
    const editor = headlessEditor();
    expect(editor.commands.insertHazardNote('danger')).toBe(true);
    const sel = editor.state.selection;
    expect(sel).toBeInstanceOf(TextSelection);
    expect(sel.$from.parent.type.name).toBe('paragraph');
    expect(sel.$from.node(-1).type.name).toBe('hazardNote');
    editor.commands.insertContent({ type: 'text', text: 'Lethal voltages inside.' });
    const json = editor.getJSON();
    expect(json.content?.[0]).toMatchObject({
      type: 'hazardNote',
      attrs: { level: 'danger', flags: null },
      content: [{ type: 'paragraph', content: [{ type: 'text', text: 'Lethal voltages inside.' }] }],
    });
    expect(validateDocument(json)).toMatchObject({ ok: true });
  });

  it('with text given, the cursor lands at the end of that text inside the note', () => {
    const editor = headlessEditor();
    editor.commands.insertHazardNote('warning', 'Work one hand', { oneHand: true });
    editor.commands.insertContent({ type: 'text', text: ' only.' });
    expect(editor.getJSON().content?.[0]).toMatchObject({
      attrs: { level: 'warning', flags: { oneHand: true } },
      content: [{ content: [{ text: 'Work one hand only.' }] }],
    });
  });

  it('level and flags survive getJSON → setContent → getJSON and a copy through HTML', () => {
    const editor = headlessEditor(doc({ type: 'hazardNote', attrs: note, content: [para('Mains inside.')] }));
    expect(editor.getJSON().content?.[0]?.attrs).toEqual(note);
    expect(reloaded(editor)).toEqual(editor.getJSON());
    expect(throughHtml(editor, 'hazardNote', note)).toEqual(note);
  });

  it('refuses an unknown level or flag; drops an unknown attribute on load', () => {
    const editor = headlessEditor();
    const before = editor.getJSON();
    expect(editor.commands.insertHazardNote('mild' as never)).toBe(false);
    expect(editor.commands.insertHazardNote('danger', '', { gloves: true } as never)).toBe(false);
    expect(editor.getJSON()).toEqual(before);
    const loaded = headlessEditor(
      doc({ type: 'hazardNote', attrs: { ...note, colour: 'red' }, content: [para()] }),
    );
    expect(loaded.getJSON().content?.[0]?.attrs).toEqual(note);
  });
});
