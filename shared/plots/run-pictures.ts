import type { Snapshot } from '../document/evaluate';
import type { ReckonerKind } from '../reckoners/registry';
import { formatQuantity } from '../units/format';
import { dischargePlot } from './discharge';
import { ladderPlot } from './ladder';
import { drawBlock, type PlotLayout, type PlotModel } from './reckoner-plot';

/**
 * The reckoner pictures a run sheet carries, the B+ staircase with the readings' bands and the discharge:
 * their layouts taken one by one (not through reckoner-plots.ts), so the run sheet's lazy chunk does not
 * pull in every layout and the reckoners they read.
 */
const RUN_SHEET_PLOTS: Partial<Record<ReckonerKind, PlotLayout>> = {
  'dropper-ladder': ladderPlot,
  bleeder: dischargePlot,
};

/**
 * The run's own pictures, drawn from its snapshot (evaluated at the bench's measured mains), so the
 * page and the PDF show the same figures. Named with the mains they were worked at.
 */
export function runPictures(snapshot: Snapshot, mainsVoltage: number): PlotModel[] {
  const at = ` (at ${formatQuantity(mainsVoltage, 'V', 4)} mains)`;
  return snapshot.blocks.flatMap((block) => {
    const layout = RUN_SHEET_PLOTS[block.kind as ReckonerKind];
    const model = layout ? drawBlock(layout, block, snapshot.readings) : null;
    return model ? [{ ...model, title: `${model.title}${at}` }] : [];
  });
}
