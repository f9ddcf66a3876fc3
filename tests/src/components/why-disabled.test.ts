import { createElement as h } from 'react';
import { renderToStaticMarkup } from 'react-dom/server';
import { describe, expect, it } from 'vitest';
import { Button } from '../../../src/components/ui/button';
import { Pager } from '../../../src/components/ui/pager';

/** The text of the element that the named button's aria-describedby points to, or null. */
function describedText(html: string, button: string) {
  const tag = new RegExp(`<button[^>]*>${button}</button>`).exec(html)?.[0] ?? '';
  const id = /aria-describedby="([^"]+)"/.exec(tag)?.[1];
  if (!id) return null;
  return new RegExp(`id="${id}"[^>]*>([^<]*)<`).exec(html)?.[1] ?? null;
}

describe('a greyed-out button says why', () => {
  it('a disabled Button shows its reason beside it and is described by it; an enabled one shows none', () => {
    const off = renderToStaticMarkup(h(Button, { disabled: true, whyDisabled: 'Saving…' }, 'Save unit'));
    expect(describedText(off, 'Save unit')).toBe('Saving…');
    const on = renderToStaticMarkup(h(Button, { whyDisabled: 'Saving…' }, 'Save unit'));
    expect(on).not.toContain('Saving…');
    expect(describedText(on, 'Save unit')).toBeNull();
  });

  it('the pager names why Previous or Next cannot be used', () => {
    const first = renderToStaticMarkup(h(Pager, { page: 1, pages: 3, onPage: () => {}, label: 'Pages' }));
    expect(describedText(first, 'Previous')).toBe('This is the first page.');
    expect(describedText(first, 'Next')).toBeNull();
    const last = renderToStaticMarkup(h(Pager, { page: 3, pages: 3, onPage: () => {}, label: 'Pages' }));
    expect(describedText(last, 'Next')).toBe('This is the last page.');
  });
});
