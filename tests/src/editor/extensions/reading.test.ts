import { describe, expect, it } from 'vitest';
import { validateDocument } from '@shared/document/schema';
import { reading } from '@shared/document/nodes';
import { doc, findNode, headlessEditor, para, reloaded, throughHtml } from '../headless';

// Every attribute the node module declares, so one it gains is round-tripped too.
const stated = {
  ...reading.defaults,
  id: 'reading-b1',
  label: 'B+ at the reservoir',
  testPoint: 'C1 +',
  meterRange: 'DC 1000 V',
  unit: 'V',
  measure: 'dc',
  expected: { ref: 'bplus.averageDc' },
  followsMains: true,
  tolerance: '±5 %',
  live: false,
};

describe('reading extension (headless editor)', () => {
  it('insertReading adds a valid volts-DC reading at ±10 % and leaves the cursor in a paragraph below it', () => {
    const editor = headlessEditor();
    expect(editor.commands.insertReading({ label: 'Heater', testPoint: 'pin 4–5' })).toBe(true);
    const json = editor.getJSON();
    expect(json.content?.map((n) => n.type)).toEqual(['reading', 'paragraph']);
    expect(json.content?.[0]?.attrs).toMatchObject({
      label: 'Heater',
      testPoint: 'pin 4–5',
      unit: 'V',
      measure: 'dc',
      tolerance: '±10 %',
      expected: { literal: '' },
    });
    expect(validateDocument(json)).toMatchObject({ ok: true });
    expect(editor.state.selection.$from.parent.type.name).toBe('paragraph');
    expect(editor.state.selection.from).toBeGreaterThan(findNode(editor, 'reading')!.pos);
  });

  it('every stated attribute survives getJSON → setContent → getJSON and a copy through HTML', () => {
    const editor = headlessEditor(doc({ type: 'reading', attrs: stated }, para()));
    expect(editor.getJSON().content?.[0]?.attrs).toEqual(stated);
    expect(reloaded(editor)).toEqual(editor.getJSON());
    expect(throughHtml(editor, 'reading', stated)).toEqual(stated);
  });

  it('an unknown attribute is dropped on load', () => {
    const editor = headlessEditor(doc({ type: 'reading', attrs: { ...stated, colour: 'red' } }));
    expect(editor.getJSON().content?.[0]?.attrs).not.toHaveProperty('colour');
    expect(editor.getJSON().content?.[0]?.attrs).toEqual(stated);
  });

  it('an insert the reading schema refuses is not made; a loaded one is named by the document check', () => {
    const editor = headlessEditor();
    const before = editor.getJSON();
    expect(editor.commands.insertReading({ unit: 'parsec' as never })).toBe(false);
    // Ohms take no measure, so the new-reading default (DC) must be cleared with it.
    expect(editor.commands.insertReading({ unit: 'Ω' })).toBe(false);
    expect(editor.getJSON()).toEqual(before);
    expect(editor.commands.insertReading({ unit: 'Ω', measure: null })).toBe(true);

    const loaded = headlessEditor(doc({ type: 'reading', attrs: { ...stated, unit: 'parsec' } }));
    const check = validateDocument(loaded.getJSON());
    expect(check.ok).toBe(false);
    if (!check.ok) expect(check.problems.map((p) => p.path)).toContain('content.0.attrs.unit');
  });
});
