import { useId, useMemo } from 'react';
import type { ResolvedReading } from '@shared/document/evaluate';
import { plotFor } from '@shared/plots/reckoner-plots';
import { ReckonerPlotSvg } from '@shared/plots/reckoner-plot-svg';
import type { BlockResult } from '@shared/reckoners';
import { PlotFigure } from './plot-figure';

/** A reckoner block's picture, if its kind has one (shared/plots/reckoner-plots.ts). Loaded lazily (visx). */
export default function ReckonerPlot({
  block,
  readings,
}: {
  block: BlockResult | undefined;
  readings: readonly ResolvedReading[];
}) {
  const id = useId();
  // The editor renders on every keystroke; the ripple picture solves the circuit again.
  const model = useMemo(() => plotFor(block, readings), [block, readings]);
  if (!model) return null;
  return (
    <div className="mt-3" data-reckoner-plot={model.plot}>
      <PlotFigure
        plot={<ReckonerPlotSvg model={model} id={id} className="h-auto w-full min-w-[560px]" />}
        label={model.title}
        caption={model.caption}
        table={model.table}
      />
    </div>
  );
}
