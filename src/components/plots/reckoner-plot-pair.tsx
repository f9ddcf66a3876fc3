import { useId, useMemo } from 'react';
import type { ResolvedReading } from '@shared/document/evaluate';
import { plotFor } from '@shared/plots/reckoner-plots';
import { ReckonerPlotSvg } from '@shared/plots/reckoner-plot-svg';
import type { BlockResult } from '@shared/reckoners';
import { PlotFigure } from './plot-figure';

export interface PlotSide {
  /** "Before: revision 2", named on the picture so the two are told apart. */
  label: string;
  block: BlockResult | undefined;
  readings: readonly ResolvedReading[];
}

export interface PlotPair {
  key: string;
  /** The block, by its reckoner's label. */
  title: string;
  before: PlotSide;
  after: PlotSide;
}

function Side({ side, id }: { side: PlotSide; id: string }) {
  const model = useMemo(() => plotFor(side.block, side.readings), [side]);
  const title = model && `${side.label}: ${model.title}`;
  return (
    <div className="flex min-w-0 flex-col gap-1">
      <h4 className="text-sm font-semibold">{side.label}</h4>
      {model ? (
        <PlotFigure
          plot={
            <ReckonerPlotSvg
              model={{ ...model, title: title! }}
              id={id}
              className="h-auto w-full min-w-[560px]"
            />
          }
          label={title!}
          caption={model.caption}
          table={model.table}
        />
      ) : (
        <p className="text-sm text-graphite-soft">
          {side.block === undefined
            ? 'Not in this revision.'
            : side.block.ok
              ? 'Nothing to draw from these inputs.'
              : 'No picture: the inputs have problems.'}
        </p>
      )}
    </div>
  );
}

/**
 * Reckoner blocks' pictures in two revisions, before beside after (stacked on a phone), under one
 * heading. Blocks with a picture on neither side are left out, and with none at all nothing is shown.
 * Loaded lazily (visx).
 */
export default function ReckonerPlotPairs({ heading, pairs }: { heading: string; pairs: PlotPair[] }) {
  const id = useId();
  const drawn = useMemo(
    () =>
      pairs.filter((p) => [p.before, p.after].some((side) => plotFor(side.block, side.readings) !== null)),
    [pairs],
  );
  if (drawn.length === 0) return null;
  return (
    <section className="flex flex-col gap-4" aria-labelledby={`${id}-heading`}>
      <h2 id={`${id}-heading`} className="text-xl font-semibold">
        {heading}
      </h2>
      {drawn.map((p) => (
        <section key={p.key} className="flex flex-col gap-2" data-plot-pair={p.key}>
          <h3 className="text-lg font-semibold">{p.title}</h3>
          <div className="grid grid-cols-1 gap-4 lg:grid-cols-2">
            <Side side={p.before} id={`${id}-${p.key}-before`} />
            <Side side={p.after} id={`${id}-${p.key}-after`} />
          </div>
        </section>
      ))}
    </section>
  );
}
