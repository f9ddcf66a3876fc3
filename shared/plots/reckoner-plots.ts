import type { ResolvedReading } from '../document/evaluate';
import type { BlockResult } from '../reckoners';
import type { ReckonerKind } from '../reckoners/registry';
import type { PlotBlock, PlotModel } from './reckoner-plot';
import { heaterPlot, partsPlot, transformerPlot } from './bars';
import { chokePlot } from './choke';
import { dischargePlot } from './discharge';
import { ladderPlot } from './ladder';
import { ripplePlot } from './ripple';
import { substitutionPlot } from './substitution';
import { fuseSurgePlot, surgePlot } from './surge';

type Layout = (block: PlotBlock, readings: readonly ResolvedReading[]) => PlotModel | null;

/** The one list of reckoner pictures: a kind here is drawn in its card (reader, review, editor). */
export const RECKONER_PLOTS: Partial<Record<ReckonerKind, Layout>> = {
  'loaded-bplus': ripplePlot,
  'dropper-ladder': ladderPlot,
  bleeder: dischargePlot,
  'heater-budget': heaterPlot,
  'transformer-loading': transformerPlot,
  'switch-on-surge': surgePlot,
  'mains-fuse': fuseSurgePlot,
  'choke-input': chokePlot,
  'rectifier-substitution': substitutionPlot,
  'part-ratings': partsPlot,
};

export const hasPlot = (kind: string): kind is keyof typeof RECKONER_PLOTS =>
  Object.prototype.hasOwnProperty.call(RECKONER_PLOTS, kind);

/**
 * A block's picture, or null: not a kind with one, not evaluated, or a snapshot stored before blocks
 * kept their validated input. A layout that cannot draw these inputs gives null too.
 */
export function plotFor(
  block: BlockResult | undefined,
  readings: readonly ResolvedReading[] = [],
): PlotModel | null {
  if (!block?.ok || !block.input || !hasPlot(block.kind)) return null;
  try {
    return RECKONER_PLOTS[block.kind]!(block, readings);
  } catch {
    // The block's own outputs stand; a picture that cannot be drawn is left out.
    return null;
  }
}
