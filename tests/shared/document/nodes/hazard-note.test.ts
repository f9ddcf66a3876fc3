import { describe, expect, it } from 'vitest';
import { hazardNote, hazardNoteAttrs } from '../../../../shared/document/nodes/hazard-note';
import type { DocNode } from '../../../../shared/document/nodes/define';

const node: DocNode = { type: 'hazardNote', content: [] };
const ctx = {
  node,
  children: () => '<p>Filter capacitors hold charge.</p>',
  reading: () => undefined,
  block: () => undefined,
};

describe('hazard note levels: the four ANSI Z535.4 signal words (docs/references.md §8, Signs)', () => {
  it.each([
    ['danger', 'DANGER'],
    ['warning', 'WARNING'],
    ['caution', 'CAUTION'],
    ['notice', 'NOTICE'],
  ] as const)('%s is accepted and rendered under the word %s', (level, word) => {
    const attrs = hazardNoteAttrs.parse({ id: 'note-000001', level });
    expect(hazardNote.html(attrs, ctx)).toContain(`<strong>${word}</strong>`);
  });

  it('refuses a level outside the four words, naming the field', () => {
    const r = hazardNoteAttrs.safeParse({ id: 'note-000001', level: 'danger!' });
    expect(r.success).toBe(false);
    expect(r.error?.issues[0]?.path).toEqual(['level']);
  });

  it('carries the level to the bench step, where the step draws its sign', () => {
    const attrs = hazardNoteAttrs.parse({ id: 'note-000001', level: 'caution' });
    const step = hazardNote.step!(attrs, {
      node,
      section: 'Power-up',
      position: 3,
      reading: () => undefined,
    });
    expect(step?.hazard?.level).toBe('caution');
  });
});
