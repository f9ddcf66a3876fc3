import { useId } from 'react';
import type { TrendView } from '@shared/schemas/units';
import { trendPlot } from '@shared/plots/trend';
import { TrendPlotSvg } from '@shared/plots/trend-plot';
import { PlotFigure } from '@/components/plots/plot-figure';

/** One reading across visits, each against the band at that visit's mains. Loaded lazily (visx). */
export default function TrendPlot({
  view,
}: {
  view: TrendView & { reading: NonNullable<TrendView['reading']> };
}) {
  const id = useId();
  if (!view.points.length)
    return <p className="text-sm text-graphite-soft">No measurements of this reading yet.</p>;
  const model = trendPlot(view);
  return (
    <PlotFigure
      plot={<TrendPlotSvg model={model} id={id} className="h-auto w-full min-w-[560px]" />}
      label={model.title}
      caption={model.caption}
      table={{
        label: 'The plotted figures as a table',
        columns: ['Visit (UTC)', 'Revision', 'Mains', `Measured (${model.unit})`, 'Expected', 'Band', 'Mark'],
        rows: model.rows.map((r, i) => ({
          key: model.points[i]!.runId,
          cells: [r.visit, r.revision, r.mains, r.measured, r.expected, r.band, r.mark],
        })),
      }}
    />
  );
}
