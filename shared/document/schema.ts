/**
 * The allowed TipTap document: node and mark types, each with its attributes. The editor's
 * extensions, the server's validation and the reader all follow this one list.
 */
import { z } from 'zod';
import { READING_MEASURES, READING_UNITS, takesMeasure } from '../reckoners/reading-units';
import { parseQuantity, QuantityParseError } from '../units/parse';

export const BLOCK_ID = /^[A-Za-z0-9_-]{6,40}$/;
export const BLOCK_NAME = /^[A-Za-z_][A-Za-z0-9_-]{0,31}$/;
export const MAX_DOC_NODES = 5_000;
export const MAX_TEXT = 20_000;
/** Lists in lists in quotes: deeper than this no procedure goes, and recursion must stay bounded. */
export const MAX_DOC_DEPTH = 24;

const blockId = z.string().regex(BLOCK_ID, 'must be 6–40 letters, digits, - or _');
const shortText = (max: number) => z.string().max(max, `at most ${max} characters`);

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

// ── values inside reckoner inputs: literals, rows, references ─────────────────
export type InputValue =
  | number
  | string
  | boolean
  | null
  | { ref: string }
  | { param: string }
  | InputValue[]
  | { [key: string]: InputValue };

export const inputValueSchema: z.ZodType<InputValue> = z.lazy(() =>
  z.union([
    z.number().refine(Number.isFinite, 'must be a finite number'),
    shortText(200),
    z.boolean(),
    z.null(),
    z.array(inputValueSchema).max(100, 'at most 100 rows'),
    z.record(z.string().max(40), inputValueSchema),
  ]),
);

/** Tolerance as people write it: "±5 %", "±10 V", "-5 %/+10 %". Parsed by the reading-tolerance reckoner. */
const toleranceText = shortText(40);

/**
 * An attribute added after documents were first stored: absent in old documents, and null from the
 * editor when unset (TipTap writes every declared attribute). Both mean "not stated".
 */
const added = <T extends z.ZodTypeAny>(schema: T) =>
  schema
    .nullish()
    .transform((v) => v ?? undefined)
    .optional();

/** Live work: done or measured on a powered unit. Absent on a reading: see isLiveReading. */
const live = added(z.boolean({ error: 'must be yes (true) or no (false)' }));

/** Readings in these units are taken on a powered unit unless marked `live: false`. */
export const LIVE_READING_UNITS: readonly string[] = ['V', 'A', 'W', 'Hz'];
// ── custom block nodes ───────────────────────────────────────────────────────
export const reckonerAttrs = z
  .object({
    id: blockId,
    /** Short name other blocks use to refer to this one's outputs ("bplus" → "bplus.averageDc"). */
    name: z
      .string()
      .regex(BLOCK_NAME, 'must start with a letter and hold only letters, digits, - or _ (max 32)'),
    kind: z.string().max(40),
    inputs: z.record(z.string().max(40), inputValueSchema),
  })
  .strict();

export const readingAttrs = z
  .object({
    id: blockId,
    label: shortText(200),
    testPoint: shortText(120),
    meterRange: shortText(60),
    unit: z.enum(READING_UNITS),
    /** For volts and amps: what the meter is set to read. Documents saved before it existed are upgraded on load. */
    measure: z.enum(READING_MEASURES).nullable().optional(),
    /** A literal as typed ("350 V") or a reckoner output ("bplus.averageDc"). */
    expected: z.union([
      z.object({ literal: shortText(40) }).strict(),
      z.object({ ref: shortText(80) }).strict(),
    ]),
    /**
     * For a typed expected value: true scales it with measured ÷ nominal mains (a winding, a rail fed
     * from one); false states it does not (a regulated rail, the mains itself); absent is unstated.
     */
    followsMains: z.boolean().nullable().optional(),
    tolerance: toleranceText,
    /** Taken on a powered unit. Absent: live when the unit is V, A, W or Hz (see isLiveReading). */
    live,
  })
  .strict()
  .superRefine((r, ctx) => {
    if (r.measure != null && !takesMeasure(r.unit)) {
      ctx.addIssue({
        code: 'custom',
        path: ['measure'],
        message: `a reading in ${r.unit} takes no measure (rms, peak, DC are for volts and amps)`,
      });
    }
  });

/** The highest threshold a discharge-verified step may name; above it the value is a slip, not a choice. */
const MAX_DISCHARGE_THRESHOLD = 1000;

/** A threshold voltage as typed ("60 V", "50 VDC"): a positive DC voltage. */
const thresholdText = z
  .string()
  .max(40, 'at most 40 characters')
  .superRefine((text, ctx) => {
    let q;
    try {
      q = parseQuantity(text, 'V');
    } catch (e) {
      if (!(e instanceof QuantityParseError)) throw e;
      ctx.addIssue({
        code: 'custom',
        message: `"${text.slice(0, 40)}" is not a voltage; write it as "60 V"`,
      });
      return;
    }
    if (!(q.value > 0) || q.value > MAX_DISCHARGE_THRESHOLD) {
      ctx.addIssue({
        code: 'custom',
        message: `must be a voltage above 0 V and at most ${MAX_DISCHARGE_THRESHOLD} V`,
      });
    } else if (q.measure && q.measure !== 'dc') {
      ctx.addIssue({
        code: 'custom',
        message: 'is a DC voltage on the discharged capacitors; write it without rms or peak',
      });
    }
  });

/**
 * What a check step asks for. Absent means 'confirm' (every step stored before the kinds existed):
 * - confirm: the technician confirms something by ticking it;
 * - discharge-verified: the filter capacitors are measured below `threshold` before anyone touches;
 * - wait: the technician waits `seconds` before going on. `drain` says what empties the capacitors
 *   meanwhile: the unit's own bleeder (the default), a discharge probe held on each node, or nothing
 *   (a wait for warming up or settling, not for discharge).
 */
export const CHECK_KINDS = ['confirm', 'discharge-verified', 'wait'] as const;
export type CheckKind = (typeof CHECK_KINDS)[number];
export const WAIT_DRAINS = ['bleeder', 'probe', 'none'] as const;
export type WaitDrain = (typeof WAIT_DRAINS)[number];

export const checkStepAttrs = z
  .object({
    id: blockId,
    text: shortText(500),
    kind: added(z.enum(CHECK_KINDS, { error: `must be one of: ${CHECK_KINDS.join(', ')}` })),
    threshold: added(thresholdText),
    seconds: added(
      z
        .number({ error: 'must be a number of seconds' })
        .refine(Number.isFinite, 'must be a finite number of seconds')
        .pipe(z.number().gt(0, 'must be more than 0 s').max(86_400, 'must be at most 86 400 s (a day)')),
    ),
    drain: added(z.enum(WAIT_DRAINS, { error: `must be one of: ${WAIT_DRAINS.join(', ')}` })),
    live,
  })
  .strict()
  .superRefine((a, ctx) => {
    const kind = a.kind ?? 'confirm';
    const only = (key: 'threshold' | 'seconds' | 'drain', owner: CheckKind) => {
      if (a[key] !== undefined && kind !== owner)
        ctx.addIssue({
          code: 'custom',
          path: [key],
          message: `only a ${owner} step takes ${key === 'seconds' ? 'a duration' : `a ${key}`}`,
        });
    };
    only('threshold', 'discharge-verified');
    only('seconds', 'wait');
    only('drain', 'wait');
    if (kind === 'discharge-verified' && a.threshold === undefined) {
      ctx.addIssue({
        code: 'custom',
        path: ['threshold'],
        message: 'a discharge-verified step needs the voltage it verifies below, e.g. "60 V"',
      });
    }
    if (kind === 'wait' && a.seconds === undefined) {
      ctx.addIssue({
        code: 'custom',
        path: ['seconds'],
        message: 'a wait step needs its duration in seconds',
      });
    }
  });

/**
 * The live-work cautions a hazard note states, as flags the procedure check can rely on (the text
 * says them in words). Each absent flag means "not stated".
 */
export const HAZARD_FLAGS = ['oneHand', 'isolation', 'currentLimited', 'discharge'] as const;
export type HazardFlag = (typeof HAZARD_FLAGS)[number];
export const HAZARD_FLAG_LABELS: Record<HazardFlag, string> = {
  oneHand: 'Work one hand only',
  isolation: 'Isolation transformer',
  currentLimited: 'Current-limited first power-up',
  discharge: 'Discharge and verify before touching',
};
const flag = added(z.boolean({ error: 'must be yes (true) or no (false)' }));

export const hazardNoteAttrs = z
  .object({
    id: blockId,
    level: z.enum(['danger', 'warning']),
    flags: added(
      z
        .object(Object.fromEntries(HAZARD_FLAGS.map((f) => [f, flag])) as Record<HazardFlag, typeof flag>, {
          error: (iss) =>
            iss.code === 'unrecognized_keys'
              ? `unknown flag ${iss.keys.map((k) => `"${k}"`).join(', ')} (flags: ${HAZARD_FLAGS.join(', ')})`
              : 'must be a set of yes/no flags',
        })
        .strict(),
    ),
  })
  .strict();

export const imageAttrs = z
  .object({
    id: blockId,
    attachmentId: z.uuid('not a stored attachment id'),
    alt: shortText(300),
    caption: shortText(300),
  })
  .strict();

export const fileAttrs = z
  .object({
    id: blockId,
    attachmentId: z.uuid('not a stored attachment id'),
    fileName: shortText(200),
    mediaType: z.enum(['application/pdf', 'image/png', 'image/jpeg', 'image/webp']),
  })
  .strict();

export type ReckonerAttrs = z.infer<typeof reckonerAttrs>;
export type ReadingAttrs = z.infer<typeof readingAttrs>;
export type CheckStepAttrs = z.infer<typeof checkStepAttrs>;
export type HazardNoteAttrs = z.infer<typeof hazardNoteAttrs>;
export type ImageAttrs = z.infer<typeof imageAttrs>;

/**
 * Whether a reading is live work. Volts, amps, watts and hertz are read on a powered unit, so a
 * reading in them is live unless the author marks it otherwise (a residual voltage on a switched-off
 * unit); resistance, capacitance, time and percentages are read cold unless marked live.
 */
export const isLiveReading = (r: Pick<ReadingAttrs, 'unit' | 'live'>): boolean =>
  r.live ?? LIVE_READING_UNITS.includes(r.unit);
export const isLiveCheck = (c: Pick<CheckStepAttrs, 'live'>): boolean => c.live === true;
export const checkKindOf = (c: Pick<CheckStepAttrs, 'kind'>): CheckKind => c.kind ?? 'confirm';
export type FileAttrs = z.infer<typeof fileAttrs>;

// ── the node list ────────────────────────────────────────────────────────────
/** Each allowed node: its attribute schema (null = none) and what it may contain. */
export const nodeSpecs = {
  doc: { attrs: null, content: 'block' },
  paragraph: { attrs: z.object({ textAlign: z.null().optional() }).strict(), content: 'inline' },
  heading: {
    attrs: z.object({ level: z.union([z.literal(1), z.literal(2), z.literal(3), z.literal(4)]) }).strict(),
    content: 'inline',
  },
  bulletList: { attrs: null, content: 'listItem' },
  orderedList: {
    attrs: z
      .object({ start: z.number().int().min(0).max(10_000), type: z.string().max(4).nullable().optional() })
      .strict(),
    content: 'listItem',
  },
  listItem: { attrs: null, content: 'block' },
  blockquote: { attrs: null, content: 'block' },
  codeBlock: { attrs: z.object({ language: z.string().max(30).nullable() }).strict(), content: 'text' },
  horizontalRule: { attrs: null, content: 'none' },
  hardBreak: { attrs: null, content: 'none' },
  text: { attrs: null, content: 'none' },
  reckoner: { attrs: reckonerAttrs, content: 'none' },
  reading: { attrs: readingAttrs, content: 'none' },
  checkStep: { attrs: checkStepAttrs, content: 'none' },
  hazardNote: { attrs: hazardNoteAttrs, content: 'paragraph' },
  image: { attrs: imageAttrs, content: 'none' },
  file: { attrs: fileAttrs, content: 'none' },
} as const satisfies Record<
  string,
  { attrs: z.ZodTypeAny | null; content: 'block' | 'inline' | 'listItem' | 'text' | 'paragraph' | 'none' }
>;

export type NodeType = keyof typeof nodeSpecs;
export const NODE_TYPES = Object.keys(nodeSpecs) as NodeType[];
export const INLINE_TYPES: NodeType[] = ['text', 'hardBreak'];

export interface DocNode {
  type: string;
  attrs?: Record<string, unknown>;
  content?: DocNode[];
  marks?: { type: string; attrs?: Record<string, unknown> }[];
  text?: string;
}

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
    if (typeof type !== 'string' || !(type in nodeSpecs)) {
      problems.push({
        path: path ? `${path}.type` : 'type',
        reason: `unknown node type "${String(type).slice(0, 40)}"`,
      });
      return;
    }
    const spec = nodeSpecs[type as NodeType];
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
