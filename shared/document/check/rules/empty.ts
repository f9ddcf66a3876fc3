import type { Finding, Rule } from '../types';

const where = (section: string) => (section ? ` under “${section}”` : ' at the top of the procedure');

/**
 * A hazard note or check step with no words: the technician would see a coloured box or a tick box
 * that says nothing. Flagged until it is written or removed.
 */
export const blockEmpty: Rule = {
  code: 'block-empty',
  level: 'warning',
  run(ctx) {
    const out: Finding[] = [];
    const blank = (text: string) => !text.trim();
    for (const n of ctx.blocks.hazardNotes)
      if (blank(n.text))
        out.push({
          blockId: n.id,
          message: `A hazard note${where(n.section)} is empty: write what is dangerous there, or remove it.`,
        });
    for (const c of ctx.blocks.checkSteps)
      if (blank(c.text))
        out.push({
          blockId: c.id,
          message: `A check step${where(c.section)} is empty: write what the technician confirms, or remove it.`,
        });
    return out;
  },
};
