/**
 * A procedure document holding every kind of node in the registry (shared/document/nodes), every
 * reckoner kind, every check-step kind and every signal level, for the browser tests that look at
 * every page. The samples are keyed by node type, so a new node kind does not compile until it has
 * one, and `everyKindDocument` throws if the finished document still lacks a kind.
 */
import { CHECK_KINDS, NODE_TYPES, type DocNode, type NodeType } from '../../shared/document/nodes';
import { validateDocument, type ProcedureDoc } from '../../shared/document/schema';
import { RECKONER_KINDS, reckoners } from '../../shared/reckoners';
import { freshName, initialInputs } from '../../shared/reckoners/initial-inputs';
import { SIGNAL_LEVELS } from '../../shared/safety-signs';

export interface SampleContext {
  /** A stored attachment (a small PNG) the image and file samples point at. */
  attachmentId: string;
  /** Reckoner names the base document already uses. */
  names: Set<string>;
}

const text = (t: string, marks?: DocNode['marks']): DocNode => ({
  type: 'text',
  text: t,
  ...(marks ? { marks } : {}),
});
const para = (...content: DocNode[]): DocNode => ({ type: 'paragraph', content });
const item = (t: string): DocNode => ({ type: 'listItem', content: [para(text(t))] });
let counter = 0;
const id = (prefix: string) => `tour-${prefix}-${String(++counter).padStart(3, '0')}`;

/** What each node type adds to the tour's section; types that only appear inside others add nothing. */
const SAMPLES: { [K in NodeType]: (c: SampleContext) => DocNode[] } = {
  doc: () => [],
  text: () => [
    para(
      text('Plain, '),
      text('bold', [{ type: 'bold' }]),
      text(', '),
      text('italic', [{ type: 'italic' }]),
      text(', '),
      text('underlined', [{ type: 'underline' }]),
      text(', '),
      text('struck', [{ type: 'strike' }]),
      text(', '),
      text('B+ = 342 V', [{ type: 'code' }]),
      text(' and '),
      text('a link to the service notes', [
        { type: 'link', attrs: { href: 'https://example.org/tallow-creek/service-notes' } },
      ]),
      text('.'),
    ),
  ],
  paragraph: () => [
    para(
      text(
        'A long paragraph with a long unbroken token, as people paste them: TC18-HT-SECONDARY-WINDING-RESISTANCE-AT-TWENTY-DEGREES-CELSIUS.',
      ),
    ),
  ],
  heading: () => [{ type: 'heading', attrs: { level: 3 }, content: [text('A sub-heading')] }],
  bulletList: () => [{ type: 'bulletList', content: [item('One point'), item('Another point')] }],
  orderedList: () => [
    { type: 'orderedList', attrs: { start: 1, type: null }, content: [item('First'), item('Second')] },
  ],
  listItem: () => [],
  blockquote: () => [{ type: 'blockquote', content: [para(text('A quoted line from the service notes.'))] }],
  codeBlock: () => [
    { type: 'codeBlock', attrs: { language: null }, content: [text('HT 2 × 300 V @ 120 mA\n6.3 V @ 2.5 A')] },
  ],
  horizontalRule: () => [{ type: 'horizontalRule' }],
  hardBreak: () => [para(text('A line'), { type: 'hardBreak' }, text('and the next line.'))],
  reckoner: ({ names }) =>
    RECKONER_KINDS.map((kind) => {
      const name = freshName(kind, names);
      names.add(name);
      return {
        type: 'reckoner',
        attrs: { id: id('rk'), name, kind, inputs: initialInputs(reckoners[kind].fields) },
      };
    }),
  reading: () => [
    {
      type: 'reading',
      attrs: {
        id: id('rd'),
        label: 'HT secondary, one half, off load',
        testPoint: 'TP1 to centre tap',
        meterRange: '1000 V AC',
        unit: 'V',
        measure: 'rms',
        expected: { literal: '300 V' },
        followsMains: true,
        tolerance: '±5 %',
      },
    },
    {
      type: 'reading',
      attrs: {
        id: id('rd'),
        label: 'B+ at the reservoir, a hold point',
        testPoint: 'C1 positive to chassis',
        meterRange: '1000 V DC',
        unit: 'V',
        measure: 'dc',
        expected: { literal: '340 V' },
        followsMains: true,
        tolerance: '±10 %',
        holdPoint: true,
      },
    },
  ],
  checkStep: () =>
    CHECK_KINDS.map((kind) => ({
      type: 'checkStep',
      attrs: {
        id: id('ck'),
        text: `A ${kind} step on the tour.`,
        kind,
        ...(kind === 'discharge-verified' ? { threshold: '60 V' } : {}),
        ...(kind === 'wait' ? { seconds: 60, drain: 'bleeder' } : {}),
      },
    })),
  hazardNote: () =>
    SIGNAL_LEVELS.map((level) => ({
      type: 'hazardNote',
      attrs: {
        id: id('hz'),
        level,
        flags: { oneHand: true, isolation: true, currentLimited: true, discharge: true },
      },
      content: [para(text(`A ${level} note: the filter capacitors hold a charge after switch-off.`))],
    })),
  image: ({ attachmentId }) => [
    {
      type: 'image',
      attrs: { id: id('im'), attachmentId, alt: 'Filter board, top view', caption: 'Filter board' },
    },
  ],
  file: ({ attachmentId }) => [
    {
      type: 'file',
      attrs: { id: id('fl'), attachmentId, fileName: 'filter-board.png', mediaType: 'image/png' },
    },
  ],
};

/** The node types a document holds. */
export function nodeTypesIn(node: DocNode, seen = new Set<string>()): Set<string> {
  seen.add(node.type);
  for (const child of node.content ?? []) nodeTypesIn(child, seen);
  return seen;
}

/** `base` (a real procedure) followed by a section with a sample of every node kind. */
export function everyKindDocument(base: ProcedureDoc, attachmentId: string): ProcedureDoc {
  const names = new Set<string>();
  (function collect(n: DocNode) {
    if (n.type === 'reckoner') names.add(String(n.attrs?.name));
    n.content?.forEach(collect);
  })(base);
  const section = NODE_TYPES.flatMap((type) => SAMPLES[type]({ attachmentId, names }));
  const doc: ProcedureDoc = {
    ...base,
    content: [
      ...(base.content ?? []),
      { type: 'heading', attrs: { level: 2 }, content: [text('Every kind of block')] },
      ...section,
    ],
  };
  const missing = NODE_TYPES.filter((t) => !nodeTypesIn(doc).has(t));
  if (missing.length) throw new Error(`the tour's draft has no ${missing.join(', ')} node`);
  const valid = validateDocument(doc);
  if (!valid.ok)
    throw new Error(
      `the tour's draft is not a valid document: ${JSON.stringify(valid.problems.slice(0, 3))}`,
    );
  return doc;
}
