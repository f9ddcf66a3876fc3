import { describe, expect, it } from 'vitest';
import { MARK_TYPES, NODE_TYPES } from '@shared/document/schema';
import { headlessEditor } from '../headless';

describe('procedure editor extensions', () => {
  it('hold exactly the node and mark types of the document registry', () => {
    const { schema } = headlessEditor();
    expect(Object.keys(schema.nodes).sort()).toEqual([...NODE_TYPES].sort());
    expect(Object.keys(schema.marks).sort()).toEqual([...MARK_TYPES].sort());
  });
});
