/**
 * Load-time upgrade of documents saved before fields declared what they hold. Applied wherever a
 * document is evaluated or opened for editing, so stored drafts, approved revisions (whose stored
 * bytes never change) and the demo content all behave the same. Each node module says how its own
 * attributes upgrade (a reading's measure, a reckoner's followed parameters).
 */
import type { Measure } from '../reckoners/types';
import { nodeDef, readingMeasure, type UpgradeOptions } from './nodes';
import type { DocNode, ProcedureDoc, ReadingAttrs } from './schema';

export { readingMeasure };

/** Measure of a reading for comparisons: 'scalar' for units that take none. */
export function effectiveMeasure(r: Pick<ReadingAttrs, 'unit' | 'measure' | 'meterRange'>): Measure {
  return readingMeasure(r) ?? 'scalar';
}

function upgradeNode(node: DocNode, opts: UpgradeOptions): DocNode {
  let next = node;
  const attrs = node.attrs && nodeDef(node.type)?.upgrade?.(node.attrs as never, opts);
  if (attrs) next = { ...node, attrs };
  if (next.content) next = { ...next, content: next.content.map((c) => upgradeNode(c, opts)) };
  return next;
}

/**
 * `reckoners: false` leaves block inputs as stored: evaluation follows empty fields itself and
 * records them as followed, which an explicit link would hide.
 */
export function upgradeDocument<T extends ProcedureDoc>(doc: T, opts: { reckoners?: boolean } = {}): T {
  return upgradeNode(doc, { reckoners: opts.reckoners ?? true }) as T;
}
