import { AxisBottom } from '@visx/axis';
import { GridColumns } from '@visx/grid';
import type { ReadingsPlot } from '../runs/readings-plot';
import { deviationLayout } from './deviation-layout';
import { AxisTitle, Legend, Marker, TickLabel, PlotFrame } from './parts';
import { PLOT_COLOURS, PLOT_FONTS } from './theme';

/**
 * The readings against their bands, as SVG: the run-sheet page shows it and the PDF draws the same
 * markup (renderToStaticMarkup + svg-to-pdfkit), so everything is set by attributes, none by CSS.
 */
export function DeviationPlotSvg({
  plot,
  id,
  className,
}: {
  plot: ReadingsPlot;
  id: string;
  className?: string;
}) {
  const l = deviationLayout(plot);
  const zero = l.x(0);
  return (
    <PlotFrame
      id={id}
      kind="readings"
      width={l.width}
      height={l.height}
      title={plot.title}
      description={plot.description}
      className={className}
    >
      <Legend
        x={l.x.range()[0]! + 8}
        y={14}
        items={[
          { kind: 'band', text: 'tolerance band' },
          { kind: 'within', text: 'in band' },
          { kind: 'out', text: 'out of band' },
        ]}
      />
      <GridColumns
        scale={l.x}
        tickValues={l.ticks}
        top={l.plotTop}
        height={l.plotBottom - l.plotTop}
        stroke={PLOT_COLOURS.rule}
        strokeDasharray="3 3"
      />
      {l.rows.map((r) => (
        <g key={r.stepId} data-plot-step={r.stepId}>
          <text
            x={l.x.range()[0]! - 12}
            y={r.y + 4}
            textAnchor="end"
            fontFamily={PLOT_FONTS.words}
            fontSize={12}
            fill={PLOT_COLOURS.graphite}
          >
            {r.label}
          </text>
          <rect
            x={r.band.x0}
            y={r.y - 9}
            width={Math.max(1, r.band.x1 - r.band.x0)}
            height={18}
            fill={PLOT_COLOURS.accentWash}
            stroke={PLOT_COLOURS.accent}
            strokeWidth={0.5}
          />
        </g>
      ))}
      <line
        x1={zero}
        x2={zero}
        y1={l.plotTop - 4}
        y2={l.plotBottom + 4}
        stroke={PLOT_COLOURS.accentDeep}
        strokeWidth={1.5}
      />
      {l.rows.map((r) => (
        <g key={r.stepId} data-plot-point={r.stepId}>
          {r.clipped && (
            <polygon
              data-clipped={r.clipped}
              points={
                r.clipped === 'high'
                  ? `${r.point.x + 16},${r.y} ${r.point.x + 9},${r.y - 5} ${r.point.x + 9},${r.y + 5}`
                  : `${r.point.x - 16},${r.y} ${r.point.x - 9},${r.y - 5} ${r.point.x - 9},${r.y + 5}`
              }
              fill={PLOT_COLOURS.out}
            />
          )}
          <Marker x={r.point.x} y={r.y} kind={r.point.kind} />
          <title>{r.title}</title>
        </g>
      ))}
      <AxisBottom
        scale={l.x}
        top={l.plotBottom + 6}
        tickValues={l.ticks}
        tickFormat={(v) => l.x.tickFormat(l.ticks.length)(v)}
        tickComponent={TickLabel}
        tickLabelProps={{ textAnchor: 'middle', dy: 4 }}
        stroke={PLOT_COLOURS.graphiteSoft}
        tickStroke={PLOT_COLOURS.graphiteSoft}
      />
      <AxisTitle x={(l.x.range()[0]! + l.x.range()[1]!) / 2} y={l.height - 8}>
        {plot.axisLabel}
      </AxisTitle>
    </PlotFrame>
  );
}
