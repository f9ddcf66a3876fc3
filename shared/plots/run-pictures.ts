import type { Snapshot } from '../document/evaluate';
import type { ReckonerKind } from '../reckoners/registry';
import { formatQuantity } from '../units/format';
import type { PlotModel } from './reckoner-plot';
import { plotFor } from './reckoner-plots';

/** The reckoner pictures a run sheet carries: the B+ staircase with the readings' bands, and the discharge. */
const RUN_SHEET_KINDS: readonly ReckonerKind[] = ['dropper-ladder', 'bleeder'];

/**
 * The run's own pictures, drawn from its snapshot (evaluated at the bench's measured mains), so the
 * page and the PDF show the same figures. Named with the mains they were worked at.
 */
export function runPictures(snapshot: Snapshot, mainsVoltage: number): PlotModel[] {
  const at = ` (at ${formatQuantity(mainsVoltage, 'V', 4)} mains)`;
  return snapshot.blocks.flatMap((block) => {
    if (!RUN_SHEET_KINDS.includes(block.kind as ReckonerKind)) return [];
    const model = plotFor(block, snapshot.readings);
    return model ? [{ ...model, title: `${model.title}${at}` }] : [];
  });
}
