/**
 * The allowed TipTap document: node and mark types, each with its attributes. The nodes are listed
 * once in ./nodes (each in its own module); the editor, the server's validation and the reader follow it.
 */
import { z } from 'zod';
import { INLINE_TYPES, NODES, isNodeType, type DocNode, type NodeType } from './nodes';

export * from './nodes';
export { BLOCK_NAME } from '../reckoners/field-paths';
export const MAX_DOC_NODES = 5_000;
export const MAX_TEXT = 20_000;
/** Lists in lists in quotes: deeper than this no procedure goes, and recursion must stay bounded. */
export const MAX_DOC_DEPTH = 24;

/** An http(s) or mailto link; nothing else may be a link target. */
const safeHref = z
  .string()
  .max(2_000)
  .refine(
    (href) => /^(https?:\/\/|mailto:)/i.test(href.trim()),
    'links must start with http://, https:// or mailto:',
  );

// ── marks ────────────────────────────────────────────────────────────────────
const plainMark = (type: string) => z.object({ type: z.literal(type) }).strict();
export const markSchemas = {
  bold: plainMark('bold'),
  italic: plainMark('italic'),
  underline: plainMark('underline'),
  strike: plainMark('strike'),
  code: plainMark('code'),
  link: z
    .object({
      type: z.literal('link'),
      attrs: z
        .object({
          href: safeHref,
          target: z.enum(['_blank']).nullable().optional(),
          rel: z.string().max(100).nullable().optional(),
          class: z.null().optional(),
        })
        .strict(),
    })
    .strict(),
} as const;
export type MarkType = keyof typeof markSchemas;
export const MARK_TYPES = Object.keys(markSchemas) as MarkType[];

const markSchema = z.union(
  Object.values(markSchemas) as unknown as [z.ZodTypeAny, z.ZodTypeAny, ...z.ZodTypeAny[]],
);

export interface ProcedureDoc extends DocNode {
  type: 'doc';
  content: DocNode[];
}

export interface DocProblem {
  /** Where: "content.3.attrs.kind". */
  path: string;
  reason: string;
}

function allowedChild(content: string, type: string): boolean {
  switch (content) {
    case 'block':
      return type !== 'doc' && type !== 'listItem' && !INLINE_TYPES.includes(type as NodeType);
    case 'inline':
      return INLINE_TYPES.includes(type as NodeType);
    case 'listItem':
      return type === 'listItem';
    case 'text':
      return type === 'text';
    case 'paragraph':
      return type === 'paragraph';
    default:
      return false;
  }
}

/**
 * Checks a document against the allowed node and mark set. Unknown nodes, marks and attributes
 * come back by path and name; nothing is dropped silently.
 */
export function validateDocument(
  input: unknown,
): { ok: true; doc: ProcedureDoc } | { ok: false; problems: DocProblem[] } {
  const problems: DocProblem[] = [];
  let count = 0;

  const visit = (node: unknown, path: string, parentContent: string | null, depth = 0) => {
    if (problems.length > 50) return;
    if (depth > MAX_DOC_DEPTH) {
      problems.push({ path, reason: `the document is nested more than ${MAX_DOC_DEPTH} levels deep` });
      return;
    }
    if (++count > MAX_DOC_NODES) {
      if (count === MAX_DOC_NODES + 1)
        problems.push({ path, reason: `the document has more than ${MAX_DOC_NODES} nodes` });
      return;
    }
    if (!node || typeof node !== 'object' || Array.isArray(node)) {
      problems.push({ path, reason: 'must be a node object' });
      return;
    }
    const n = node as Record<string, unknown>;
    const type = n.type;
    if (!isNodeType(type)) {
      problems.push({
        path: path ? `${path}.type` : 'type',
        reason: `unknown node type "${String(type).slice(0, 40)}"`,
      });
      return;
    }
    const spec: { attrs: z.ZodTypeAny | null; content: string } = NODES[type];
    const at = (k: string) => (path ? `${path}.${k}` : k);
    if (parentContent !== null && !allowedChild(parentContent, type)) {
      problems.push({ path: at('type'), reason: `a "${type}" node is not allowed here` });
    }
    for (const key of Object.keys(n)) {
      if (!['type', 'attrs', 'content', 'marks', 'text'].includes(key))
        problems.push({ path: at(key), reason: `unknown property "${key}"` });
    }
    if (spec.attrs) {
      const r = spec.attrs.safeParse(n.attrs ?? {});
      if (!r.success)
        for (const issue of r.error.issues)
          problems.push({ path: [at('attrs'), ...issue.path.map(String)].join('.'), reason: issue.message });
      else n.attrs = r.data;
    } else if (
      n.attrs !== undefined &&
      (typeof n.attrs !== 'object' || n.attrs === null || Object.keys(n.attrs).length > 0)
    ) {
      problems.push({ path: at('attrs'), reason: `a "${type}" node takes no attributes` });
    }
    if (type === 'text') {
      if (typeof n.text !== 'string' || n.text.length === 0)
        problems.push({ path: at('text'), reason: 'text nodes need non-empty text' });
      else if (n.text.length > MAX_TEXT)
        problems.push({ path: at('text'), reason: `at most ${MAX_TEXT} characters in one run of text` });
      if (n.marks !== undefined) {
        if (!Array.isArray(n.marks)) problems.push({ path: at('marks'), reason: 'must be a list' });
        else
          n.marks.forEach((m, i) => {
            const mt = (m as { type?: unknown })?.type;
            if (typeof mt !== 'string' || !(mt in markSchemas)) {
              problems.push({
                path: at(`marks.${i}.type`),
                reason: `unknown mark "${String(mt).slice(0, 40)}"`,
              });
              return;
            }
            const r = markSchema.safeParse(m);
            if (!r.success)
              for (const issue of r.error.issues)
                problems.push({
                  path: [at(`marks.${i}`), ...issue.path.map(String)].join('.'),
                  reason: issue.message,
                });
          });
      }
    } else if (n.marks !== undefined) {
      problems.push({ path: at('marks'), reason: 'only text carries marks' });
    } else if (n.text !== undefined) {
      problems.push({ path: at('text'), reason: `a "${type}" node holds no text of its own` });
    }
    if (n.content !== undefined) {
      if (spec.content === 'none')
        problems.push({ path: at('content'), reason: `a "${type}" node has no content` });
      else if (!Array.isArray(n.content)) problems.push({ path: at('content'), reason: 'must be a list' });
      else n.content.forEach((child, i) => visit(child, at(`content.${i}`), spec.content, depth + 1));
    }
  };

  if (!input || typeof input !== 'object' || (input as { type?: unknown }).type !== 'doc') {
    return { ok: false, problems: [{ path: 'type', reason: 'the document must be a "doc" node' }] };
  }
  visit(input, '', null);
  if (!Array.isArray((input as DocNode).content))
    problems.push({ path: 'content', reason: 'the document needs content' });
  const ids = new Set<string>();
  const names = new Set<string>();
  if (!problems.length) {
    walk(input as ProcedureDoc, (node, path) => {
      const id = node.attrs?.id;
      if (typeof id === 'string') {
        if (ids.has(id))
          problems.push({ path: `${path}.attrs.id`, reason: `block id "${id}" is used twice` });
        ids.add(id);
      }
      if (node.type === 'reckoner') {
        const name = String(node.attrs!.name);
        if (names.has(name))
          problems.push({
            path: `${path}.attrs.name`,
            reason: `two reckoners are named "${name}"; names must be unique`,
          });
        names.add(name);
      }
    });
  }
  return problems.length ? { ok: false, problems } : { ok: true, doc: input as ProcedureDoc };
}

/** Depth-first walk with each node's path ("content.2.content.0"). */
export function walk(node: DocNode, fn: (node: DocNode, path: string) => void, path = '') {
  fn(node, path);
  node.content?.forEach((child, i) => walk(child, fn, path ? `${path}.content.${i}` : `content.${i}`));
}

export const emptyDoc = (): ProcedureDoc => ({ type: 'doc', content: [{ type: 'paragraph' }] });
