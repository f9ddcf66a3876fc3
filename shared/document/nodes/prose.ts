/** The plain text nodes (TipTap's StarterKit set): no run steps, simple HTML, their text as lines. */
import { z } from 'zod';
import { defineNode, esc, textOf, type DocNode } from './define';

const ownLine = (_a: unknown, node: DocNode) => [textOf(node)];
const MARK_TAGS: Record<string, string> = {
  bold: 'strong',
  italic: 'em',
  underline: 'u',
  strike: 's',
  code: 'code',
};

export const doc = defineNode({ attrs: null, content: 'block', label: 'document' });
export const paragraph = defineNode({
  attrs: z.object({ textAlign: z.null().optional() }).strict(),
  content: 'inline',
  label: 'paragraph',
  text: ownLine,
  html: (_a, { children }) => `<p>${children()}</p>`,
});
export const heading = defineNode({
  attrs: z.object({ level: z.union([z.literal(1), z.literal(2), z.literal(3), z.literal(4)]) }).strict(),
  content: 'inline',
  label: 'heading',
  text: ownLine,
  html: (a, { children }) => `<h${a.level}>${children()}</h${a.level}>`,
});
export const bulletList = defineNode({
  attrs: null,
  content: 'listItem',
  label: 'bulleted list',
  html: (_a, { children }) => `<ul>${children()}</ul>`,
});
export const orderedList = defineNode({
  attrs: z
    .object({ start: z.number().int().min(0).max(10_000), type: z.string().max(4).nullable().optional() })
    .strict(),
  content: 'listItem',
  label: 'numbered list',
  html: (_a, { children }) => `<ol>${children()}</ol>`,
});
export const listItem = defineNode({
  attrs: null,
  content: 'block',
  label: 'list item',
  html: (_a, { children }) => `<li>${children()}</li>`,
});
export const blockquote = defineNode({
  attrs: null,
  content: 'block',
  label: 'quote',
  html: (_a, { children }) => `<blockquote>${children()}</blockquote>`,
});
export const codeBlock = defineNode({
  attrs: z.object({ language: z.string().max(30).nullable() }).strict(),
  content: 'text',
  label: 'code block',
  text: ownLine,
  html: (_a, { children }) => `<pre><code>${children()}</code></pre>`,
});
export const horizontalRule = defineNode({
  attrs: null,
  content: 'none',
  label: 'divider',
  html: () => '<hr>',
});
export const hardBreak = defineNode({
  attrs: null,
  content: 'none',
  label: 'line break',
  html: () => '<br>',
});
export const text = defineNode({
  attrs: null,
  content: 'none',
  label: 'text',
  html: (_a, { node }) => {
    let html = esc(node.text);
    for (const m of node.marks ?? []) {
      if (m.type === 'link') html = `<a href="${esc(m.attrs?.href)}" rel="noopener noreferrer">${html}</a>`;
      else if (MARK_TAGS[m.type]) html = `<${MARK_TAGS[m.type]}>${html}</${MARK_TAGS[m.type]}>`;
    }
    return html;
  },
});
