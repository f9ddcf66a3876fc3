import { formatQuantity } from '../../../units/format';
import type { BlockSnapshot } from '../../evaluate';
import type { Finding, Rule } from '../types';
import { fieldLabel, fieldsOf, reckonerName } from '../words';

type OkBlock = Extract<BlockSnapshot, { ok: true }>;

interface Given {
  block: OkBlock;
  path: string;
  value: number;
  unit: string;
}

const same = (a: number, b: number) => Math.abs(a - b) <= 1e-9 * Math.max(Math.abs(a), Math.abs(b));
const show = (g: Given) => (g.unit ? formatQuantity(g.value, g.unit, 4) : String(g.value));

/**
 * One physical part (a valve rectifier's drop, the reservoir capacitance, …: the registry's
 * FieldSpec.part) typed with different values in two blocks: one of them is wrong, and the
 * procedure's figures disagree with each other.
 */
export const partValuesDiffer: Rule = {
  code: 'part-values-differ',
  level: 'warning',
  run({ snapshot }) {
    const byPart = new Map<string, Given[]>();
    for (const block of snapshot.blocks) {
      if (!block.ok) continue;
      for (const f of fieldsOf(block.kind, block.input)) {
        if (!f.spec.part || typeof f.value !== 'number' || block.sources[f.path]?.kind !== 'typed') continue;
        byPart.set(f.spec.part, [
          ...(byPart.get(f.spec.part) ?? []),
          { block, path: f.path, value: f.value, unit: f.spec.unit ?? '' },
        ]);
      }
    }
    const out: Finding[] = [];
    for (const [part, given] of byPart) {
      const first = given[0]!;
      const other = given.find((g) => g.block.id !== first.block.id && !same(g.value, first.value));
      if (!other) continue;
      out.push({
        blockId: other.block.id,
        message: `The same part (${part.replace(/-/g, ' ')}) has two values: ${fieldLabel(first.block.kind, first.path)} is ${show(first)} in ${reckonerName(first.block)}, but ${fieldLabel(other.block.kind, other.path)} is ${show(other)} in ${reckonerName(other.block)}.`,
      });
    }
    return out;
  },
};
