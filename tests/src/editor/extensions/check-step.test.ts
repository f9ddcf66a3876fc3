import { NodeSelection } from '@tiptap/pm/state';
import { describe, expect, it } from 'vitest';
import { validateDocument } from '@shared/document/schema';
import { checkStep } from '@shared/document/nodes';
import { doc, findNode, headlessEditor, para, reloaded, throughHtml } from '../headless';

// Every attribute the node module declares, so one it gains is round-tripped too.
const wait = {
  ...checkStep.defaults,
  id: 'check-wait-1',
  text: 'Switched off: wait for the bleeder.',
  kind: 'wait',
  threshold: null,
  seconds: 90,
  drain: 'probe',
  live: null,
};

describe('check-step extension (headless editor)', () => {
  it('insertCheckStep adds a plain confirmation and selects it, so its text is written next', () => {
    const editor = headlessEditor();
    expect(editor.commands.insertCheckStep('Fuse is 1 A slow-blow.')).toBe(true);
    const step = findNode(editor, 'checkStep')!;
    expect(step.attrs).toMatchObject({ text: 'Fuse is 1 A slow-blow.', kind: null, live: null });
    expect(validateDocument(editor.getJSON())).toMatchObject({ ok: true });
    // The new step itself is selected (its form takes the caret), not the paragraph below it.
    const sel = editor.state.selection;
    expect(sel).toBeInstanceOf(NodeSelection);
    expect(sel.from).toBe(step.pos);
  });

  it('a block inserted while the new step is selected goes after it, not over it', () => {
    const editor = headlessEditor();
    editor.commands.insertCheckStep('First');
    editor.commands.insertCheckStep('Second');
    const texts: string[] = [];
    editor.state.doc.forEach((n) => {
      if (n.type.name === 'checkStep') texts.push(String(n.attrs.text));
    });
    expect(texts).toEqual(['First', 'Second']);
  });

  it('a wait step survives getJSON → setContent → getJSON and a copy through HTML', () => {
    const editor = headlessEditor(doc({ type: 'checkStep', attrs: wait }, para()));
    expect(editor.getJSON().content?.[0]?.attrs).toEqual(wait);
    expect(reloaded(editor)).toEqual(editor.getJSON());
    expect(throughHtml(editor, 'checkStep', wait)).toEqual(wait);
  });

  it('refuses a step its schema refuses (a discharge step without a threshold, a threshold in amps)', () => {
    const editor = headlessEditor();
    const before = editor.getJSON();
    expect(editor.commands.insertCheckStep('x', { kind: 'discharge-verified' })).toBe(false);
    expect(editor.commands.insertCheckStep('x', { kind: 'discharge-verified', threshold: '2 A' })).toBe(
      false,
    );
    expect(editor.commands.insertCheckStep('x', { kind: 'wait', threshold: '60 V', seconds: 5 })).toBe(false);
    expect(editor.getJSON()).toEqual(before);
    expect(editor.commands.insertCheckStep('x', { kind: 'discharge-verified', threshold: '60 V' })).toBe(
      true,
    );
  });

  it('an unknown attribute is dropped on load', () => {
    const editor = headlessEditor(doc({ type: 'checkStep', attrs: { ...wait, owner: 'ann' } }));
    expect(editor.getJSON().content?.[0]?.attrs).toEqual(wait);
  });
});
