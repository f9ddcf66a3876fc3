import { useId } from 'react';
import type { ReadingsPlot } from '@shared/runs/readings-plot';
import { DeviationPlotSvg } from '@shared/plots/deviation-plot';
import { PlotFigure } from '@/components/plots/plot-figure';

/** The run sheet's readings against their bands: the same model and SVG the PDF draws. Loaded lazily (visx). */
export default function DeviationPlot({ plot }: { plot: ReadingsPlot }) {
  const id = useId();
  if (!plot.readings.length) return <p className="text-sm text-graphite-soft">{plot.description}</p>;
  return (
    <PlotFigure
      plot={<DeviationPlotSvg plot={plot} id={id} className="h-auto w-full min-w-[560px]" />}
      label={plot.title}
      caption={plot.caption}
      notes={plot.notPlotted}
      table={{
        label: 'The plotted figures as a table',
        columns: ['Reading', 'Band (% of expected)', plot.axisLabel, 'Mark'],
        rows: plot.readings.map((r) => ({
          key: r.stepId,
          cells: [`${r.position}. ${r.label}`, r.text.band, r.text.deviation, r.text.mark],
        })),
      }}
    />
  );
}
