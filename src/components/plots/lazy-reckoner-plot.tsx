import { lazy, Suspense } from 'react';
import type { ResolvedReading } from '@shared/document/evaluate';
import type { BlockResult } from '@shared/reckoners';
import type { PlotPair } from './reckoner-plot-pair';

const ReckonerPlot = lazy(() => import('./reckoner-plot'));
const ReckonerPlotPairs = lazy(() => import('./reckoner-plot-pair'));

/**
 * Where a reckoner card puts its picture: the plotting code (visx) loads only when a card with a
 * working result is shown, and the lazy module draws nothing for a kind without a picture.
 */
export function LazyReckonerPlot(props: {
  block: BlockResult | undefined;
  readings: readonly ResolvedReading[];
}) {
  if (!props.block?.ok) return null;
  return (
    <Suspense fallback={null}>
      <ReckonerPlot {...props} />
    </Suspense>
  );
}

/** Blocks' pictures before and after a change (the review page), loaded the same lazy way. */
export function LazyReckonerPlotPairs(props: { heading: string; pairs: PlotPair[] }) {
  if (props.pairs.length === 0) return null;
  return (
    <Suspense fallback={null}>
      <ReckonerPlotPairs {...props} />
    </Suspense>
  );
}
