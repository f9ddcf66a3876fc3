import type { Finding, Rule } from '../types';
import { capitalise, reckonerName } from '../words';

/**
 * Every caution a reckoner raises, at its own level, on its block. The same caution word for word
 * from several blocks (the local-codes note, say) appears once, on the first of them.
 */
export const reckonerCautions: Rule = {
  code: 'reckoner-caution',
  level: 'warning',
  run({ snapshot }) {
    const seen = new Set<string>();
    const out: Finding[] = [];
    for (const block of snapshot.blocks) {
      if (!block.ok) continue;
      for (const c of block.cautions) {
        const key = `${c.code}\u0000${c.message}`;
        if (seen.has(key)) continue;
        seen.add(key);
        out.push({
          blockId: block.id,
          level: c.level,
          caution: c.code,
          message: `${capitalise(reckonerName(block))}: ${c.message}`,
        });
      }
    }
    return out;
  },
};
