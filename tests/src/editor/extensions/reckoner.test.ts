import { describe, expect, it } from 'vitest';
import { validateDocument } from '@shared/document/schema';
import { getReckoner } from '@shared/reckoners';
import { reckoner } from '@shared/document/nodes';
import { doc, headlessEditor, para, reloaded, throughHtml } from '../headless';

// Every attribute the node module declares, so one it gains is round-tripped too.
const stored = {
  ...reckoner.defaults,
  id: 'reckoner-1',
  name: 'fuse',
  kind: 'mains-fuse',
  inputs: { mainsVoltage: { param: 'mainsVoltage' }, windings: [{ volts: '6.3', amps: '2' }] },
};

describe('reckoner extension (headless editor)', () => {
  it('insertReckoner adds a block of the kind with every declared field and a fresh name each time', () => {
    const editor = headlessEditor();
    expect(editor.commands.insertReckoner('mains-fuse')).toBe(true);
    expect(editor.commands.insertReckoner('mains-fuse')).toBe(true);
    const blocks = editor.getJSON().content!.filter((n) => n.type === 'reckoner');
    expect(blocks.map((b) => b.attrs?.name)).toEqual(['mainsFuse', 'mainsFuse2']);
    const fields = getReckoner('mains-fuse')!.fields.map((f) => f.key);
    expect(Object.keys(blocks[0]!.attrs!.inputs).sort()).toEqual([...fields].sort());
    expect(validateDocument(editor.getJSON())).toMatchObject({ ok: true });
  });

  it('its attributes (inputs as nested JSON) survive getJSON → setContent → getJSON and a copy through HTML', () => {
    const editor = headlessEditor(doc({ type: 'reckoner', attrs: stored }, para()));
    expect(editor.getJSON().content?.[0]?.attrs).toEqual(stored);
    expect(reloaded(editor)).toEqual(editor.getJSON());
    expect(throughHtml(editor, 'reckoner', stored)).toEqual(stored);
  });

  it('refuses an unknown kind; drops an unknown attribute on load; a bad name is named by the check', () => {
    const editor = headlessEditor();
    const before = editor.getJSON();
    expect(editor.commands.insertReckoner('flux-capacitor')).toBe(false);
    expect(editor.getJSON()).toEqual(before);
    const loaded = headlessEditor(doc({ type: 'reckoner', attrs: { ...stored, outputs: { a: 1 } } }));
    expect(loaded.getJSON().content?.[0]?.attrs).toEqual(stored);
    const badName = headlessEditor(doc({ type: 'reckoner', attrs: { ...stored, name: '_peak' } }));
    const check = validateDocument(badName.getJSON());
    expect(check.ok).toBe(false);
    if (!check.ok) expect(check.problems.map((p) => p.path)).toEqual(['content.0.attrs.name']);
  });
});
