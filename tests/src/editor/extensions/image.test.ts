import { describe, expect, it } from 'vitest';
import { validateDocument } from '@shared/document/schema';
import { image } from '@shared/document/nodes';
import { doc, headlessEditor, para, reloaded, throughHtml } from '../headless';

// Every attribute the node module declares, so one it gains is round-tripped too.
const stored = {
  ...image.defaults,
  id: 'image-01',
  attachmentId: '3f2b8a4e-9c1d-4e5f-8a7b-6c5d4e3f2a1b',
  alt: 'Underside of the chassis',
  caption: 'Filter caps after the recap',
};

describe('image extension (headless editor)', () => {
  it('insertImage adds the image by attachment id, with empty alt and caption unless given', () => {
    const editor = headlessEditor();
    expect(editor.commands.insertImage({ attachmentId: stored.attachmentId })).toBe(true);
    const json = editor.getJSON();
    expect(json.content?.[0]).toMatchObject({
      type: 'image',
      attrs: { attachmentId: stored.attachmentId, alt: '', caption: '' },
    });
    expect(validateDocument(json)).toMatchObject({ ok: true });
  });

  it('its attributes survive getJSON → setContent → getJSON and a copy through HTML', () => {
    const editor = headlessEditor(doc({ type: 'image', attrs: stored }, para()));
    expect(editor.getJSON().content?.[0]?.attrs).toEqual(stored);
    expect(reloaded(editor)).toEqual(editor.getJSON());
    expect(throughHtml(editor, 'image', stored)).toEqual(stored);
  });

  it('refuses an attachment id that is not one (a URL); drops an unknown attribute on load', () => {
    const editor = headlessEditor();
    const before = editor.getJSON();
    expect(editor.commands.insertImage({ attachmentId: 'https://example.com/x.png' })).toBe(false);
    expect(editor.getJSON()).toEqual(before);
    const loaded = headlessEditor(
      doc({ type: 'image', attrs: { ...stored, src: 'https://example.com/x.png' } }),
    );
    expect(loaded.getJSON().content?.[0]?.attrs).toEqual(stored);
  });
});
