/**
 * Load-time upgrade of documents saved before fields declared what they hold. Applied wherever a
 * document is evaluated or opened for editing, so stored drafts, approved revisions (whose stored
 * bytes never change) and the demo content all behave the same:
 * - a reading in volts or amps without a measure gets one, from its meter range ("AC 20 V" → rms,
 *   "DC 1000 V" → dc) or else DC;
 * - an empty reckoner field that follows a procedure parameter is pointed at it, so a block
 *   inserted before the declarations follows the bench's measured mains.
 */
import { getReckoner } from '../reckoners/registry';
import { withFollowedParams } from '../reckoners/field-paths';
import { takesMeasure } from '../reckoners/reading-units';
import type { Measure } from '../reckoners/types';
import type { DocNode, ProcedureDoc, ReadingAttrs } from './schema';

type ReadingMeasure = NonNullable<ReadingAttrs['measure']>;

/** The measure a reading states, or the one its meter range implies. Undefined for units without one. */
export function readingMeasure(
  r: Pick<ReadingAttrs, 'unit' | 'measure' | 'meterRange'>,
): ReadingMeasure | undefined {
  if (!takesMeasure(r.unit)) return undefined;
  if (r.measure) return r.measure;
  if (/\bAC\b|~|\brms\b/i.test(r.meterRange)) return 'rms';
  if (/\bp-?p\b/i.test(r.meterRange)) return 'peak-to-peak';
  return 'dc';
}

/** Measure of a reading for comparisons: 'scalar' for units that take none. */
export function effectiveMeasure(r: Pick<ReadingAttrs, 'unit' | 'measure' | 'meterRange'>): Measure {
  return readingMeasure(r) ?? 'scalar';
}

function upgradeNode(node: DocNode, reckoners: boolean): DocNode {
  let next = node;
  if (node.type === 'reading' && node.attrs) {
    const a = node.attrs as ReadingAttrs;
    const measure = readingMeasure(a);
    if (measure && a.measure !== measure) next = { ...node, attrs: { ...a, measure } };
  } else if (reckoners && node.type === 'reckoner' && node.attrs) {
    const def = getReckoner(String(node.attrs.kind));
    const inputs = node.attrs.inputs as Record<string, unknown> | undefined;
    if (def && inputs && typeof inputs === 'object') {
      const up = withFollowedParams(inputs, def.fields);
      if (up.followed.size) next = { ...node, attrs: { ...node.attrs, inputs: up.inputs } };
    }
  }
  if (next.content) next = { ...next, content: next.content.map((c) => upgradeNode(c, reckoners)) };
  return next;
}

/**
 * `reckoners: false` leaves block inputs as stored: evaluation follows empty fields itself and
 * records them as followed, which an explicit link would hide.
 */
export function upgradeDocument<T extends ProcedureDoc>(doc: T, opts: { reckoners?: boolean } = {}): T {
  return upgradeNode(doc, opts.reckoners ?? true) as T;
}
