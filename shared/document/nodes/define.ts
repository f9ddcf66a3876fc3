/**
 * What one document node is, in one place: its attributes (zod), their defaults, its plain-text
 * lines, its HTML and its run step. The registry in ./index.ts lists every node once; the schema,
 * search extraction, the server's HTML, run steps, the editor and the reader all read from it.
 */
import { z } from 'zod';
import type { ResolvedReading, BlockSnapshot } from '../evaluate';
import type { RunStep } from '../../schemas/runs';

export interface DocNode {
  type: string;
  attrs?: Record<string, unknown>;
  content?: DocNode[];
  marks?: { type: string; attrs?: Record<string, unknown> }[];
  text?: string;
}

/** What a node may contain: any block, inline text, list items, text only, paragraphs, or nothing. */
export type Content = 'block' | 'inline' | 'listItem' | 'text' | 'paragraph' | 'none';

export interface HtmlContext {
  node: DocNode;
  /** The node's children, rendered. */
  children: () => string;
  reading: (id: string) => ResolvedReading | undefined;
  block: (id: string) => BlockSnapshot | undefined;
}

export interface StepContext {
  node: DocNode;
  /** The top-level heading the node sits under, '' before the first. */
  section: string;
  /** 1-based place among the run's steps. */
  position: number;
  reading: (id: string) => ResolvedReading | undefined;
}

export interface UpgradeOptions {
  /** Point empty reckoner fields at the procedure parameter they follow. */
  reckoners: boolean;
}

type AttrsSchema = z.ZodType<Record<string, unknown>, Record<string, unknown>>;
type Input<S> = S extends z.ZodTypeAny ? z.input<S> : Record<string, never>;
type Output<S> = S extends z.ZodTypeAny ? z.output<S> : Record<string, never>;

// Methods, not function properties: a node's own attribute type stands in for the general one.
export interface NodeDef<S extends AttrsSchema | null = AttrsSchema | null> {
  /** Attribute schema; null for a node without attributes. */
  attrs: S;
  content: Content;
  /** What people call it ("check step"), in problems and headings. */
  label: string;
  /** A block's list in extractBlocks ("readings"). */
  many?: string;
  /**
   * Every attribute with the value it has when unset (null: "not stated"). The editor declares its
   * attributes from these: a string default is kept as text in HTML, anything else as JSON.
   */
  defaults?: { [K in keyof Input<S>]-?: Input<S>[K] | null };
  /** Values a newly inserted block starts with, over the defaults. */
  inserted?: Partial<Input<S>>;
  /** Lines for search and diffs; `inner` gives the children's lines. Without it: the children's lines. */
  text?(a: Output<S>, node: DocNode, inner: () => string[]): string[];
  /** Static HTML, escaped (see esc); sanitized by the server afterwards. Without it: the children. */
  html?(a: Output<S>, ctx: HtmlContext): string;
  /**
   * Load-time upgrade of attributes stored before the node declared what they hold (see
   * ../upgrade.ts); undefined when nothing changes.
   */
  upgrade?(a: Output<S>, opts: UpgradeOptions): Record<string, unknown> | undefined;
  /** The node as a bench-run step; null when it is not one (or cannot be one). */
  step?(a: Output<S>, ctx: StepContext): RunStep | null;
}

/** A node definition, its literal shape kept (so `many: 'readings'` types extractBlocks' result). */
export const defineNode = <S extends AttrsSchema | null, const D extends Omit<NodeDef<S>, 'attrs'>>(
  def: { attrs: S } & D,
) => def;

// ── attribute pieces shared by nodes ─────────────────────────────────────────
export const BLOCK_ID = /^[A-Za-z0-9_-]{6,40}$/;
export const blockId = z.string().regex(BLOCK_ID, 'must be 6–40 letters, digits, - or _');
export const shortText = (max: number) => z.string().max(max, `at most ${max} characters`);

/**
 * An attribute added after documents were first stored: absent in old documents, and null from the
 * editor when unset (TipTap writes every declared attribute). Both mean "not stated".
 */
export const added = <T extends z.ZodTypeAny>(schema: T) =>
  schema
    .nullish()
    .transform((v) => v ?? undefined)
    .optional();

export const yesNo = () => added(z.boolean({ error: 'must be yes (true) or no (false)' }));

// ── text and HTML helpers ────────────────────────────────────────────────────
export function textOf(node: DocNode): string {
  if (node.type === 'text') return node.text ?? '';
  if (node.type === 'hardBreak') return '\n';
  return (node.content ?? []).map(textOf).join('');
}

export const esc = (s: unknown) =>
  String(s ?? '').replace(
    /[&<>"']/g,
    (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!,
  );
