import sanitizeHtml from 'sanitize-html';
import type { Snapshot } from '../../../shared/document/evaluate';
import { nodeDef, type DocNode, type HtmlContext, type ProcedureDoc } from '../../../shared/document/schema';

/**
 * A static HTML render of a revision (for search snippets, diffs, print and PDF), with reckoner
 * outputs and reading bands taken from the server's own snapshot. Each node module renders its own
 * node, escaping what it writes; the whole is then passed through sanitize-html with an allowlist
 * that mirrors the document schema.
 */
export function renderRevisionHtml(doc: ProcedureDoc, snapshot: Snapshot): string {
  const blocks = new Map(snapshot.blocks.map((b) => [b.id, b]));
  const readings = new Map(snapshot.readings.map((r) => [r.id, r]));
  const children = (n: DocNode) => (n.content ?? []).map(render).join('');

  function render(node: DocNode): string {
    const ctx: HtmlContext = {
      node,
      children: () => children(node),
      reading: (id) => readings.get(id),
      block: (id) => blocks.get(id),
    };
    const html = nodeDef(node.type)?.html;
    return html ? html((node.attrs ?? {}) as never, ctx) : children(node);
  }

  return sanitizeRevisionHtml(children(doc));
}

/**
 * The allowlist: the tags the renderer emits, http(s)/mailto links only, no styles, no scripts.
 * sanitize-html's parser does not close elements the way a browser does in every context, so one
 * pass over hostile markup can leave nesting (a table inside a paragraph, say) that a browser, and
 * the next pass, rebuild differently. Passes repeat until the output stops changing (every pass is
 * itself allowlisted), so what is stored is what a browser will see and sanitizing it again is a no-op.
 */
export function sanitizeRevisionHtml(html: string): string {
  let out = sanitizeOnce(html);
  for (let pass = 0; pass < 4; pass++) {
    const again = sanitizeOnce(out);
    if (again === out) break;
    out = again;
  }
  return out;
}

function sanitizeOnce(html: string): string {
  return sanitizeHtml(html, {
    allowedTags: [
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
    ],
    allowedAttributes: {
      a: ['href', 'rel'],
      img: ['src', 'alt'],
      aside: ['class'],
      p: ['class'],
      table: ['class'],
    },
    allowedClasses: {
      aside: ['hazard-note', 'hazard-danger', 'hazard-warning'],
      p: ['check-step'],
      table: ['reading', 'reckoner'],
    },
    allowedSchemes: ['http', 'https', 'mailto'],
    allowedSchemesByTag: { img: [] },
    allowProtocolRelative: false,
    disallowedTagsMode: 'discard',
    // Images only ever come from our own attachment store.
    exclusiveFilter: (frame) =>
      frame.tag === 'img' && !/^\/api\/attachments\/[0-9a-f-]{36}$/.test(frame.attribs.src ?? ''),
  });
}
