import { AxisBottom, AxisLeft } from '@visx/axis';
import { GridRows } from '@visx/grid';
import { AxisTitle, Legend, Marker, TickLabel, PlotFrame } from './parts';
import { PLOT_COLOURS } from './theme';
import { trendPlot } from './trend';

export type TrendModel = ReturnType<typeof trendPlot>;

/** One reading across visits as SVG, set by attributes only (as the readings plot, so it could go to a PDF too). */
export function TrendPlotSvg({
  model: m,
  id,
  className,
}: {
  model: TrendModel;
  id: string;
  className?: string;
}) {
  const [top, bottom] = [m.y.range()[1]!, m.y.range()[0]!];
  const line = (pts: readonly (readonly [number, number])[]) => pts.map((p) => p.join(',')).join(' ');
  return (
    <PlotFrame
      id={id}
      kind="trend"
      width={m.width}
      height={m.height}
      title={m.title}
      description={m.description}
      className={className}
    >
      <Legend
        x={m.x.range()[0]! + 8}
        y={14}
        items={[
          { kind: 'band', text: 'tolerance band at the visit’s mains' },
          { kind: 'within', text: 'in band' },
          { kind: 'out', text: 'out of band' },
        ]}
      />
      <GridRows
        scale={m.y}
        tickValues={m.ticks}
        left={m.x.range()[0]}
        width={m.x.range()[1]! - m.x.range()[0]!}
        stroke={PLOT_COLOURS.rule}
        strokeDasharray="3 3"
      />
      {m.band.length > 0 && (
        <polygon
          points={line(m.band as [number, number][])}
          fill={PLOT_COLOURS.accentWash}
          stroke={PLOT_COLOURS.accent}
          strokeWidth={0.5}
        />
      )}
      {m.expected.length > 1 && (
        <polyline
          points={line(m.expected)}
          fill="none"
          stroke={PLOT_COLOURS.accentDeep}
          strokeDasharray="6 4"
        />
      )}
      <polyline
        points={line(m.points.map((p) => [p.x, p.y] as const))}
        fill="none"
        stroke={PLOT_COLOURS.graphite}
        strokeWidth={1.5}
      />
      {m.points.map((p) => (
        <g key={p.runId} data-plot-visit={p.runId}>
          <Marker x={p.x} y={p.y} kind={p.kind} />
          <title>{p.title}</title>
        </g>
      ))}
      <AxisLeft
        scale={m.y}
        left={m.x.range()[0]! - 8}
        tickValues={m.ticks}
        tickFormat={(v) => m.y.tickFormat(m.ticks.length)(v)}
        tickComponent={TickLabel}
        tickLabelProps={{ textAnchor: 'end', dy: 4 }}
        stroke={PLOT_COLOURS.graphiteSoft}
        tickStroke={PLOT_COLOURS.graphiteSoft}
      />
      <AxisBottom
        scale={m.x}
        top={bottom + 6}
        tickValues={m.named}
        tickFormat={(i) => `${m.points[i]!.date}\n${m.points[i]!.mains}`}
        tickComponent={TickLabel}
        tickLabelProps={{ textAnchor: 'middle', dy: 4 }}
        stroke={PLOT_COLOURS.graphiteSoft}
        tickStroke={PLOT_COLOURS.graphiteSoft}
      />
      <AxisTitle x={18} y={(top + bottom) / 2} rotate>
        {m.yLabel}
      </AxisTitle>
      <AxisTitle x={(m.x.range()[0]! + m.x.range()[1]!) / 2} y={m.height - 8}>
        {m.xLabel}
      </AxisTitle>
    </PlotFrame>
  );
}
