export type MarkKind = 'within' | 'out' | 'none' | 'missing';
/** The mark of a reading, in words as well as colour. */
export const MARK_WORDS: Record<MarkKind, string> = {
  within: 'in band',
  out: 'out of band',
  none: 'no band',
  missing: 'not recorded',
};
export const markOf = (measured: number | null | undefined, within: boolean | null): MarkKind =>
  measured == null ? 'missing' : within === null ? 'none' : within ? 'within' : 'out';
