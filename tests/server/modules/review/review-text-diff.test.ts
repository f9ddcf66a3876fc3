import { describe, expect, it } from 'vitest';
import { diffText } from '../../../../server/modules/review/diff/text-diff';

/** The text one side of the diff shows, line by line. */
const side = (lines: ReturnType<typeof diffText>, drop: 'add' | 'del') =>
  lines
    .filter((l) => l.kind !== (drop === 'add' ? 'added' : 'removed'))
    .map((l) =>
      l.parts
        .filter((p) => p.op !== drop)
        .map((p) => p.text)
        .join(''),
    )
    .join('\n');

const words = (s: string) => s.split(/\s+/).filter(Boolean);

describe('review text diff', () => {
  const before = [
    'Safety',
    'Bring the unit up on a current-limited supply first.',
    'Measure the HT at the reservoir.',
    'Check the heater chain.',
  ].join('\n');
  const after = [
    'Safety',
    'Bring the unit up on a variac first.',
    'Discharge the filter capacitors.',
    'Measure the HT at the reservoir.',
  ].join('\n');

  it('marks lines same, changed, added and removed, with word changes inside a changed line', () => {
    const lines = diffText(before, after);
    expect(lines.map((l) => l.kind)).toEqual(['same', 'changed', 'added', 'same', 'removed']);
    expect(lines[1]!.parts).toEqual([
      { op: 'same', text: 'Bring the unit up on a ' },
      { op: 'del', text: 'current-limited supply' },
      { op: 'add', text: 'variac' },
      { op: 'same', text: ' first.' },
    ]);
  });

  it('gives back the new text exactly and the old one word for word', () => {
    const a = 'one  two\tthree\n\nfour five\nsix';
    const b = 'one two\tthree 3\n\nfour  five\nseven\nsix';
    for (const [x, y] of [
      [before, after],
      [a, b],
      [b, a],
      ['', a],
      [a, ''],
    ] as const) {
      const lines = diffText(x, y);
      expect(side(lines, 'del')).toBe(y);
      // Spacing is not compared inside a changed line: kept words carry the new line's spacing.
      expect(words(side(lines, 'add'))).toEqual(words(x));
      expect(side(lines, 'add').split('\n')).toHaveLength(x.split('\n').length);
    }
  });

  it('shows a rewrite beyond the edit limit as all lines removed, then all added', () => {
    const a = Array.from({ length: 3000 }, (_, i) => `old line ${i}`).join('\n');
    const b = Array.from({ length: 3000 }, (_, i) => `new line ${i}`).join('\n');
    const lines = diffText(a, b);
    expect(lines.every((l) => l.kind === 'changed')).toBe(true);
    expect(side(lines, 'add')).toBe(a);
    expect(side(lines, 'del')).toBe(b);
  });
});
