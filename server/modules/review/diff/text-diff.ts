import { diffArrays, diffWords } from 'diff';
import type { DiffLine, DiffPart } from '../../../../shared/schemas/review';

/**
 * Most line edits we diff exactly (Myers' O(ND) algorithm, in jsdiff); a revision rewritten beyond
 * that is shown as all its old lines removed and all its new lines added.
 */
const MAX_EDITS = 2000;

/**
 * Word changes inside one changed line. Words and punctuation are compared, whitespace is not
 * (a removed phrase reads as one part, not split around a shared space); text both sides keep is
 * shown with the new line's spacing.
 */
const wordParts = (before: string, after: string): DiffPart[] =>
  diffWords(before, after).map((c) => ({
    op: c.added ? 'add' : c.removed ? 'del' : 'same',
    text: c.value,
  }));

/** A reviewer's diff of two plain texts: line by line, and word by word inside lines that changed. */
export function diffText(before: string, after: string): DiffLine[] {
  const a = before.split('\n');
  const b = after.split('\n');
  const changes = diffArrays(a, b, { maxEditLength: MAX_EDITS }) ?? [
    { value: a, removed: true, added: false, count: a.length },
    { value: b, removed: false, added: true, count: b.length },
  ];
  const lines: DiffLine[] = [];
  for (let k = 0; k < changes.length; k++) {
    const c = changes[k]!;
    if (!c.added && !c.removed) {
      for (const text of c.value) lines.push({ kind: 'same', parts: [{ op: 'same', text }] });
      continue;
    }
    // A run of removed and added lines: pair them up and show word changes inside each pair.
    const removed: string[] = [];
    const added: string[] = [];
    for (; k < changes.length && (changes[k]!.added || changes[k]!.removed); k++)
      (changes[k]!.removed ? removed : added).push(...changes[k]!.value);
    k--;
    const pairs = Math.min(removed.length, added.length);
    for (let p = 0; p < pairs; p++) lines.push({ kind: 'changed', parts: wordParts(removed[p]!, added[p]!) });
    for (const text of removed.slice(pairs)) lines.push({ kind: 'removed', parts: [{ op: 'del', text }] });
    for (const text of added.slice(pairs)) lines.push({ kind: 'added', parts: [{ op: 'add', text }] });
  }
  return lines;
}
