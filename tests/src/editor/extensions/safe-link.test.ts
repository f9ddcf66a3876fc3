import { describe, expect, it } from 'vitest';
import { validateDocument } from '@shared/document/schema';
import { doc, headlessEditor, reloaded } from '../headless';

const linked = (href: string, extra: Record<string, unknown> = {}) =>
  doc({
    type: 'paragraph',
    content: [{ type: 'text', text: 'datasheet', marks: [{ type: 'link', attrs: { href, ...extra } }] }],
  });

describe('safe-link extension (headless editor)', () => {
  it('setLink on selected text adds an http(s) link the document schema accepts, without a title', () => {
    const editor = headlessEditor(doc({ type: 'paragraph', content: [{ type: 'text', text: 'datasheet' }] }));
    editor.commands.selectAll();
    expect(editor.commands.setLink({ href: 'https://example.com/6v6.pdf' })).toBe(true);
    const mark = editor.getJSON().content?.[0]?.content?.[0]?.marks?.[0];
    expect(mark?.attrs?.href).toBe('https://example.com/6v6.pdf');
    expect(mark?.attrs).not.toHaveProperty('title');
    expect(validateDocument(editor.getJSON())).toMatchObject({ ok: true });
    expect(reloaded(editor)).toEqual(editor.getJSON());
  });

  it('refuses a javascript: link and drops a title on load', () => {
    const editor = headlessEditor(doc({ type: 'paragraph', content: [{ type: 'text', text: 'x' }] }));
    editor.commands.selectAll();
    editor.commands.setLink({ href: 'javascript:alert(1)' });
    expect(editor.getJSON().content?.[0]?.content?.[0]?.marks ?? []).toEqual([]);
    const loaded = headlessEditor(linked('mailto:shop@example.com', { title: 'Mail us' }));
    const attrs = loaded.getJSON().content?.[0]?.content?.[0]?.marks?.[0]?.attrs;
    expect(attrs?.href).toBe('mailto:shop@example.com');
    expect(attrs).not.toHaveProperty('title');
  });
});
