import { useId, useMemo } from 'react';
import { runPictures } from '@shared/plots/run-pictures';
import { ReckonerPlotSvg } from '@shared/plots/reckoner-plot-svg';
import type { RunView } from '@shared/schemas/runs';
import { PlotFigure } from '@/components/plots/plot-figure';

/** The run's reckoner pictures at its measured mains: the same models the PDF draws. Loaded lazily (visx). */
export default function RunReckonerPictures({ run }: { run: RunView }) {
  const id = useId();
  const models = useMemo(() => runPictures(run.snapshot, run.params.mainsVoltage), [run]);
  if (models.length === 0) return null;
  return (
    <section className="flex flex-col gap-4 print:break-inside-avoid" data-run-pictures>
      <h2 className="text-lg font-semibold">Calculations at the bench’s mains</h2>
      {models.map((m, i) => (
        <PlotFigure
          key={`${m.plot}-${i}`}
          plot={<ReckonerPlotSvg model={m} id={`${id}-${i}`} className="h-auto w-full min-w-[560px]" />}
          label={m.title}
          caption={m.caption}
          table={m.table}
        />
      ))}
    </section>
  );
}
