import type { ResolvedReading } from '../document/evaluate';
import type { BlockResult } from '../reckoners';
import type { ReckonerKind } from '../reckoners/registry';
import { drawBlock, type PlotLayout, type PlotModel } from './reckoner-plot';
import { heaterPlot, partsPlot, transformerPlot } from './bars';
import { chokePlot } from './choke';
import { dischargePlot } from './discharge';
import { ladderPlot } from './ladder';
import { ripplePlot } from './ripple';
import { substitutionPlot } from './substitution';
import { fuseSurgePlot, surgePlot } from './surge';

/** The one list of reckoner pictures: a kind here is drawn in its card (reader, review, editor). */
export const RECKONER_PLOTS: Partial<Record<ReckonerKind, PlotLayout>> = {
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

/** A block's picture, or null: not a kind with one, or not drawable (`drawBlock`). */
export function plotFor(
  block: BlockResult | undefined,
  readings: readonly ResolvedReading[] = [],
): PlotModel | null {
  return block && hasPlot(block.kind) ? drawBlock(RECKONER_PLOTS[block.kind]!, block, readings) : null;
}
