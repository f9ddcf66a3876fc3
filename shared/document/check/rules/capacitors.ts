import { getReckoner } from '../../../reckoners/registry';
import type { BlockSnapshot, Snapshot } from '../../evaluate';
import type { Finding, Rule } from '../types';
import { capitalise, fieldLabel, fieldsOf, reckonerName, volts } from '../words';

/**
 * The highest no-load DC of the procedure (each reckoner's declared noLoadOutputs). With nothing
 * drawing current every filter node, down the whole dropping ladder, sits near it.
 */
function highestNoLoad(snapshot: Snapshot): { volts: number; block: BlockSnapshot } | null {
  let best: { volts: number; block: BlockSnapshot } | null = null;
  for (const block of snapshot.blocks) {
    if (!block.ok) continue;
    for (const key of getReckoner(block.kind)?.noLoadOutputs ?? []) {
      const v = block.outputs[key]?.value;
      if (typeof v === 'number' && (!best || v > best.volts)) best = { volts: v, block };
    }
  }
  return best;
}

/**
 * Every capacitor voltage rating in the procedure (inputs the registry marks as one) must be at
 * least the highest no-load DC of the procedure with the mains at its high limit.
 */
export const capacitorRatingLow: Rule = {
  code: 'capacitor-rating-low',
  level: 'danger',
  run(ctx) {
    const ratings = ctx.snapshot.blocks.flatMap((block) =>
      block.ok
        ? fieldsOf(block.kind, block.input)
            .filter((f) => f.spec.rating === 'capacitor-voltage' && typeof f.value === 'number')
            .map((f) => ({ block, path: f.path, rating: f.value as number }))
        : [],
    );
    if (!ratings.length) return [];
    const high = highestNoLoad(ctx.atHighMains());
    if (!high) return [];
    const mains = ctx.snapshot.params.mainsNominal * (1 + ctx.options.highMainsPercent / 100);
    const out: Finding[] = [];
    for (const r of ratings) {
      if (r.rating >= high.volts) continue;
      out.push({
        blockId: r.block.id,
        message: `${capitalise(reckonerName(r.block))}: ${fieldLabel(r.block.kind, r.path)} is ${volts(r.rating)}, below the ${volts(high.volts)} no-load DC of ${reckonerName(high.block)} at high mains (${volts(mains)}, nominal +${ctx.options.highMainsPercent} %).`,
      });
    }
    return out;
  },
};
