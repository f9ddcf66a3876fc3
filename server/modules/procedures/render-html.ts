import sanitizeHtml from 'sanitize-html';
import type { Snapshot } from '../../../shared/document/evaluate';
import { checkStepHeading, hazardFlagWords } from '../../../shared/document/extract';
import {
  checkKindOf,
  isLiveReading,
  type CheckStepAttrs,
  type DocNode,
  type HazardNoteAttrs,
  type ProcedureDoc,
  type ReadingAttrs,
} from '../../../shared/document/schema';

const esc = (s: unknown) =>
  String(s ?? '').replace(
    /[&<>"']/g,
    (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!,
  );

const MARK_TAGS: Record<string, string> = {
  bold: 'strong',
  italic: 'em',
  underline: 'u',
  strike: 's',
  code: 'code',
};

/**
 * A static HTML render of a revision (for search snippets, diffs, print and PDF), with reckoner
 * outputs and reading bands taken from the server's own snapshot. Everything is escaped here and
 * then passed through sanitize-html with an allowlist that mirrors the document schema.
 */
export function renderRevisionHtml(doc: ProcedureDoc, snapshot: Snapshot): string {
  const blocks = new Map(snapshot.blocks.map((b) => [b.id, b]));
  const readings = new Map(snapshot.readings.map((r) => [r.id, r]));

  const inline = (n: DocNode): string => {
    if (n.type === 'hardBreak') return '<br>';
    let html = esc(n.text);
    for (const m of n.marks ?? []) {
      if (m.type === 'link') html = `<a href="${esc(m.attrs?.href)}" rel="noopener noreferrer">${html}</a>`;
      else if (MARK_TAGS[m.type]) html = `<${MARK_TAGS[m.type]}>${html}</${MARK_TAGS[m.type]}>`;
    }
    return html;
  };
  const children = (n: DocNode) => (n.content ?? []).map(render).join('');

  function render(n: DocNode): string {
    const a = (n.attrs ?? {}) as Record<string, unknown>;
    switch (n.type) {
      case 'text':
      case 'hardBreak':
        return inline(n);
      case 'paragraph':
        return `<p>${children(n)}</p>`;
      case 'heading':
        return `<h${a.level}>${children(n)}</h${a.level}>`;
      case 'bulletList':
        return `<ul>${children(n)}</ul>`;
      case 'orderedList':
        return `<ol>${children(n)}</ol>`;
      case 'listItem':
        return `<li>${children(n)}</li>`;
      case 'blockquote':
        return `<blockquote>${children(n)}</blockquote>`;
      case 'codeBlock':
        return `<pre><code>${children(n)}</code></pre>`;
      case 'horizontalRule':
        return '<hr>';
      case 'hazardNote': {
        const flags = hazardFlagWords(a as HazardNoteAttrs);
        return `<aside class="hazard-note hazard-${esc(a.level)}"><p><strong>${a.level === 'danger' ? 'DANGER' : 'WARNING'}</strong></p>${flags ? `<p><em>${esc(flags)}</em></p>` : ''}${children(n)}</aside>`;
      }
      case 'checkStep': {
        const c = a as CheckStepAttrs;
        // A plain confirmation prints as it always has; a structured step leads with what it asks for.
        const head =
          checkKindOf(c) === 'confirm' && !c.live ? '' : `<strong>${esc(checkStepHeading(c))}:</strong> `;
        return `<p class="check-step">☐ ${head}${esc(a.text)}</p>`;
      }
      case 'reading': {
        const r = readings.get(String(a.id));
        const band = r?.bandText ?? `not resolved: ${r?.error ?? 'unknown'}`;
        const live = isLiveReading(a as ReadingAttrs) ? '<tr><th>Live work</th><td>yes</td></tr>' : '';
        return `<table class="reading"><tbody><tr><th>Measure</th><td>${esc(a.label)}</td></tr><tr><th>At</th><td>${esc(a.testPoint)}</td></tr><tr><th>Meter range</th><td>${esc(a.meterRange)}</td></tr><tr><th>Expected</th><td>${esc(band)} (${esc(a.tolerance)})</td></tr>${live}</tbody></table>`;
      }
      case 'reckoner': {
        const b = blocks.get(String(a.id));
        if (!b) return '';
        const rows = b.ok
          ? Object.values(b.outputs)
              .map((o) => `<tr><th>${esc(o.label)}</th><td>${esc(o.formatted)}</td></tr>`)
              .join('')
          : b.errors.map((e) => `<tr><th>${esc(e.field)}</th><td>${esc(e.reason)}</td></tr>`).join('');
        return `<table class="reckoner"><caption>${esc(b.name)}</caption><tbody>${rows}</tbody></table>`;
      }
      case 'image':
        return `<figure><img src="/api/attachments/${esc(a.attachmentId)}" alt="${esc(a.alt)}"><figcaption>${esc(a.caption)}</figcaption></figure>`;
      case 'file':
        return `<p><a href="/api/attachments/${esc(a.attachmentId)}">${esc(a.fileName)}</a></p>`;
      default:
        return children(n);
    }
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
