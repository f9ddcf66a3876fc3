import { describe, expect, it } from 'vitest';
import { validateDocument } from '@shared/document/schema';
import { file } from '@shared/document/nodes';
import { doc, headlessEditor, para, reloaded, throughHtml } from '../headless';

// Every attribute the node module declares, so one it gains is round-tripped too.
const stored = {
  ...file.defaults,
  id: 'file-0001',
  attachmentId: '0e1d2c3b-4a59-4687-9a8b-7c6d5e4f3a2b',
  fileName: 'schematic.pdf',
  mediaType: 'application/pdf',
};

describe('file extension (headless editor)', () => {
  it('insertFile adds a link to the uploaded file', () => {
    const editor = headlessEditor();
    const { id: _id, ...attrs } = stored;
    expect(editor.commands.insertFile({ ...attrs, mediaType: 'image/png', fileName: 'scope.png' })).toBe(
      true,
    );
    const json = editor.getJSON();
    expect(json.content?.[0]).toMatchObject({
      type: 'file',
      attrs: { attachmentId: stored.attachmentId, fileName: 'scope.png', mediaType: 'image/png' },
    });
    expect(validateDocument(json)).toMatchObject({ ok: true });
  });

  it('its attributes survive getJSON → setContent → getJSON and a copy through HTML', () => {
    const editor = headlessEditor(doc({ type: 'file', attrs: stored }, para()));
    expect(editor.getJSON().content?.[0]?.attrs).toEqual(stored);
    expect(reloaded(editor)).toEqual(editor.getJSON());
    expect(throughHtml(editor, 'file', stored)).toEqual(stored);
  });

  it('refuses a media type the store does not take; drops an unknown attribute on load', () => {
    const editor = headlessEditor();
    const before = editor.getJSON();
    const { id: _id, ...attrs } = stored;
    expect(editor.commands.insertFile({ ...attrs, mediaType: 'text/html' as never })).toBe(false);
    expect(editor.getJSON()).toEqual(before);
    const loaded = headlessEditor(doc({ type: 'file', attrs: { ...stored, size: 1234 } }));
    expect(loaded.getJSON().content?.[0]?.attrs).toEqual(stored);
  });
});
