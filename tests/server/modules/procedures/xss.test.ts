// Hostile strings stored through every text field of a procedure and rendered by the server.
// Corpora: big-list-of-naughty-strings by Max Woolf and contributors, MIT licence (npm package
// big-list-of-naughty-strings, blns.json) — 461 strings, 211 of them script-injection attempts; and
// filter-evasion vectors after the OWASP XSS Filter Evasion Cheat Sheet (tests/support/xss-evasion.ts,
// written from memory, see its header).
import fc from 'fast-check';
import { createRequire } from 'node:module';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sanitizeRevisionHtml } from '../../../../server/modules/procedures/render-html';
import { createTestApp, type TestApp } from '../../../support/test-app';
import { EVASION_VECTORS } from '../../../support/xss-evasion';

const blns = [
  ...(createRequire(import.meta.url)('big-list-of-naughty-strings/blns.json') as string[]),
  ...EVASION_VECTORS,
];

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

const ALLOWED_TAGS = new Set([
  'p',
  'br',
  'strong',
  'em',
  'u',
  's',
  'code',
  'pre',
  'a',
  'h1',
  'h2',
  'h3',
  'h4',
  'ul',
  'ol',
  'li',
  'blockquote',
  'hr',
  'aside',
  'table',
  'caption',
  'tbody',
  'tr',
  'th',
  'td',
  'figure',
  'img',
  'figcaption',
]);

/** Every tag in the HTML is allowlisted, no tag carries an event handler or a script URL. */
function assertInert(html: string, context: string) {
  for (const m of html.matchAll(/<\/?([a-zA-Z][a-zA-Z0-9-]*)([^>]*)>/g)) {
    const [tag, attrs] = [m[1]!.toLowerCase(), m[2]!];
    expect(ALLOWED_TAGS.has(tag), `${context}: tag <${tag}>`).toBe(true);
    // Attribute names only: text inside quoted values is inert.
    const names = attrs.replace(/"[^"]*"/g, '""');
    expect(names, `${context}: attributes of <${tag}>`).not.toMatch(/\son[a-z]+\s*=/i);
    for (const a of attrs.matchAll(/([a-zA-Z-]+)\s*=\s*"([^"]*)"/g)) {
      if (!['href', 'src'].includes(a[1]!.toLowerCase())) continue;
      // What a browser would take as the URL's scheme: entities decoded, controls and spaces gone.
      const url = a[2]!
        .replace(/&#x?([0-9a-f]+);?/gi, (_s, n: string) =>
          String.fromCharCode(parseInt(n, /^\d+$/.test(n) ? 10 : 16)),
        )
        .replace(/&colon;/gi, ':')
        // eslint-disable-next-line no-control-regex -- browsers ignore these inside a URL scheme
        .replace(/[\u0000-\u0020]/g, '');
      expect(url, `${context}: ${a[1]} of <${tag}>`).not.toMatch(/^(javascript|vbscript|data):/i);
      if (tag === 'img') expect(url, `${context}: image source`).toMatch(/^\/api\/attachments\//);
    }
    expect(names, `${context}: style on <${tag}>`).not.toMatch(/\sstyle\s*=/i);
  }
}

describe('hostile text in procedures', () => {
  it('every naughty string, in the title, a paragraph, a reading and a check step, is stored inert or refused with 400', async () => {
    const hal = await t.as('hal');
    const meta = {
      title: 'XSS corpus holder',
      equipmentFamily: 'Table radio',
      equipmentModel: 'TC-5R',
      tags: [],
    };
    const created = await hal.post('/api/procedures').send(meta);
    let lock = created.body.revision.lockVersion as number;
    const id = created.body.revision.id as string;
    const statuses = new Map<number, number>();
    // Batches keep the run short while every string passes through every field.
    for (let i = 0; i < blns.length; i += 40) {
      const batch = blns.slice(i, i + 40).filter((s) => s.length > 0);
      const content = batch.flatMap((s, j) => [
        { type: 'paragraph', content: [{ type: 'text', text: s }] },
        { type: 'checkStep', attrs: { id: `check-${i + j}`, text: s.slice(0, 500) } },
        {
          type: 'reading',
          attrs: {
            id: `read-${i + j}`,
            label: s.slice(0, 200),
            testPoint: s.slice(0, 120),
            meterRange: '1000 V DC',
            unit: 'V',
            expected: { literal: '250 V' },
            tolerance: '±10 %',
          },
        },
      ]);
      const res = await hal.put(`/api/revisions/${id}`).send({
        ...meta,
        title: `Corpus ${batch[0]!.slice(0, 100)}`.trim().padEnd(3, '.'),
        params: { mainsNominal: 230, mainsVoltage: 230, mainsFrequency: 50 },
        lockVersion: lock,
        document: { type: 'doc', content },
      });
      statuses.set(res.status, (statuses.get(res.status) ?? 0) + 1);
      expect([200, 400], `batch at ${i}: ${JSON.stringify(res.body).slice(0, 200)}`).toContain(res.status);
      if (res.status === 200) {
        lock = res.body.revision.lockVersion;
        assertInert(res.body.revision.html, `batch at ${i}`);
        // The text itself survives as text: the stored document is what was sent.
        expect(res.body.revision.document.content.length).toBe(content.length);
      }
    }
    expect(statuses.get(200)).toBeGreaterThan(0);
  });

  it('every filter-evasion vector given to the sanitizer as HTML comes out inert, and stays so when sanitized again', () => {
    for (const vector of EVASION_VECTORS) {
      const once = sanitizeRevisionHtml(vector);
      assertInert(once, vector.slice(0, 60));
      expect(once, vector.slice(0, 60)).not.toMatch(
        /<(script|iframe|object|embed|meta|base|link|style|xmp|noscript|svg|math|form|input|textarea|title)\b/i,
      );
      expect(sanitizeRevisionHtml(once)).toBe(once);
    }
  });

  it('the sanitizer leaves only allowlisted markup and is idempotent, for generated strings mixed with the corpus', () => {
    const corpus = fc.constantFrom(...blns);
    const fragment = fc.oneof(
      corpus,
      fc.string(),
      fc.constantFrom('<', '>', '"', "'", '=', 'on', 'javascript:', '<a href="', '<img src=x ', '</', '&#'),
    );
    fc.assert(
      fc.property(fc.array(fragment, { maxLength: 8 }), (parts) => {
        const once = sanitizeRevisionHtml(parts.join(''));
        assertInert(once, 'generated');
        expect(sanitizeRevisionHtml(once)).toBe(once);
      }),
      { numRuns: 400 },
    );
  });
});
