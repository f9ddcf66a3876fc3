import { describe, expect, it } from 'vitest';
import type { z } from 'zod';
import { BLOCKS, NODES, validateDocument, type NodeDef } from '../../../../shared/document/schema';
import { evaluateProcedure } from '../../../../shared/reckoners/evaluate';

const shapeKeys = (schema: z.ZodTypeAny) => Object.keys((schema as unknown as z.ZodObject).shape).sort();

describe('the document node registry', () => {
  it.each(Object.entries(BLOCKS))(
    '%s: a default for every attribute its schema declares, and no other',
    (_, def) => {
      const d = def as NodeDef;
      expect(Object.keys(d.defaults ?? {}).sort()).toEqual(shapeKeys(d.attrs!));
    },
  );

  it.each(['reckoner', 'reading', 'checkStep', 'hazardNote'] as const)(
    '%s: a new block (defaults, new-block values, an id) passes its own schema',
    (type) => {
      const def = NODES[type] as NodeDef;
      // A reckoner's name is given by the editor when it inserts one; no other node has a name.
      const named = type === 'reckoner' ? { name: 'b1' } : {};
      const parsed = def.attrs!.safeParse({ ...def.defaults, ...def.inserted, id: 'block-0001', ...named });
      expect(parsed.success ? [] : parsed.error.issues).toEqual([]);
    },
  );
});

describe('one block-name rule for the document schema and the evaluator', () => {
  const names = [
    'bplus',
    'B_plus-2',
    'x',
    'a'.repeat(32),
    '_peak',
    '-peak',
    '9volts',
    'b plus',
    'a'.repeat(33),
    '',
  ];
  const schemaTakes = (name: string) =>
    validateDocument({
      type: 'doc',
      content: [{ type: 'reckoner', attrs: { id: 'block-0001', name, kind: 'mains-fuse', inputs: {} } }],
    }).ok;
  const evaluatorTakes = (name: string) => {
    const [block] = evaluateProcedure([{ name, kind: 'mains-fuse', inputs: {} }]).blocks;
    return block!.ok || !block!.errors.some((e) => e.field === 'name');
  };

  it.each(names)('"%s": accepted by both or refused by both', (name) => {
    expect(schemaTakes(name)).toBe(evaluatorTakes(name));
  });

  it('a name starting with "_" is refused when saved, not only when evaluated', () => {
    expect(schemaTakes('_peak')).toBe(false);
    expect(schemaTakes('peak')).toBe(true);
  });
});
