import { AxisBottom, AxisLeft } from '@visx/axis';
import { GridColumns, GridRows } from '@visx/grid';
import { AxisTitle, TickLabel, PlotFrame } from './parts';
import type { LegendSign, LineStyle, MarkShape, PlotModel } from './reckoner-plot';
import { PLOT_COLOURS, PLOT_FONTS } from './theme';

const DASH: Record<LineStyle, string | undefined> = { solid: undefined, dashed: '7 4', dotted: '2 3' };

/** A mark by shape (and the theme's graphite), so marks differ without colour. */
export function ShapeMark({ x, y, shape, r = 6 }: { x: number; y: number; shape: MarkShape; r?: number }) {
  const common = {
    fill: PLOT_COLOURS.graphite,
    stroke: PLOT_COLOURS.card,
    strokeWidth: 1,
    'data-shape': shape,
  };
  switch (shape) {
    case 'circle':
      return <circle cx={x} cy={y} r={r} {...common} fill={PLOT_COLOURS.accentDeep} />;
    case 'square':
      return <rect x={x - r} y={y - r} width={2 * r} height={2 * r} {...common} />;
    case 'diamond':
      return (
        <polygon
          points={`${x},${y - r * 1.3} ${x + r * 1.3},${y} ${x},${y + r * 1.3} ${x - r * 1.3},${y}`}
          {...common}
          fill={PLOT_COLOURS.card}
          stroke={PLOT_COLOURS.graphite}
          strokeWidth={2}
        />
      );
    case 'triangle':
      return (
        <polygon
          points={`${x},${y + r * 1.25} ${x + r * 1.15},${y - r * 0.85} ${x - r * 1.15},${y - r * 0.85}`}
          {...common}
        />
      );
  }
}

function LegendMark({ x, y, sign }: { x: number; y: number; sign: LegendSign }) {
  if ('band' in sign)
    return (
      <rect
        x={x - 7}
        y={y - 7}
        width={14}
        height={14}
        fill={PLOT_COLOURS.accentWash}
        stroke={PLOT_COLOURS.accent}
      />
    );
  if ('shape' in sign) return <ShapeMark x={x} y={y} shape={sign.shape} r={5} />;
  if ('bar' in sign) return <rect x={x - 9} y={y - 5} width={18} height={10} fill={PLOT_COLOURS.accent} />;
  return (
    <line
      x1={x - 9}
      x2={x + 9}
      y1={y}
      y2={y}
      stroke={sign.strong ? PLOT_COLOURS.graphite : PLOT_COLOURS.accentDeep}
      strokeWidth={sign.strong ? 2 : 1.5}
      strokeDasharray={DASH[sign.line]}
    />
  );
}

/**
 * A reckoner's picture as SVG, set by attributes only (no CSS), so a PDF could draw the same markup
 * through svg-to-pdfkit as the run sheet's plot does.
 */
export function ReckonerPlotSvg({
  model: m,
  id,
  className,
}: {
  model: PlotModel;
  id: string;
  className?: string;
}) {
  const [left, right] = m.x.scale.range() as [number, number];
  // A value axis runs upwards; rows of bars run downwards: either way the frame is the range's ends.
  const [top, bottom] = [Math.min(...m.y.scale.range()), Math.max(...m.y.scale.range())];
  let legendAt = left + 8;
  return (
    <PlotFrame
      id={id}
      kind={m.plot}
      width={m.width}
      height={m.height}
      title={m.title}
      description={m.description}
      className={className}
    >
      <g data-legend="">
        {m.legend.map((item) => {
          const start = legendAt;
          legendAt += 32 + item.text.length * 6.2;
          return (
            <g key={item.text}>
              <LegendMark x={start} y={16} sign={item.sign} />
              <text
                x={start + 14}
                y={20}
                fontFamily={PLOT_FONTS.words}
                fontSize={11}
                fill={PLOT_COLOURS.graphite}
              >
                {item.text}
              </text>
            </g>
          );
        })}
      </g>
      {m.grid === 'columns' ? (
        <GridColumns
          scale={m.x.scale}
          tickValues={m.x.ticks}
          top={top}
          height={bottom - top}
          stroke={PLOT_COLOURS.rule}
          strokeDasharray="3 3"
        />
      ) : (
        <GridRows
          scale={m.y.scale}
          tickValues={m.y.ticks}
          left={left}
          width={right - left}
          stroke={PLOT_COLOURS.rule}
          strokeDasharray="3 3"
        />
      )}
      {m.bands.map((b) => (
        <rect
          key={b.key}
          data-band={b.key}
          x={Math.min(b.x0, b.x1)}
          y={Math.min(b.y0, b.y1)}
          width={Math.max(1, Math.abs(b.x1 - b.x0))}
          height={Math.max(1, Math.abs(b.y1 - b.y0))}
          fill={PLOT_COLOURS.accentWash}
          stroke={PLOT_COLOURS.accent}
          strokeWidth={0.5}
        >
          <title>{b.title}</title>
        </rect>
      ))}
      {m.bars?.map((b) => (
        <rect
          key={b.key}
          data-bar={b.key}
          x={Math.min(b.x0, b.x1)}
          y={Math.min(b.y0, b.y1)}
          width={Math.max(1, Math.abs(b.x1 - b.x0))}
          height={Math.abs(b.y1 - b.y0)}
          fill={PLOT_COLOURS.accent}
        >
          <title>{b.title}</title>
        </rect>
      ))}
      {m.lines.map((l) => (
        <polyline
          key={l.key}
          data-line={l.key}
          points={l.points.map((p) => p.join(',')).join(' ')}
          fill="none"
          stroke={l.strong ? PLOT_COLOURS.graphite : PLOT_COLOURS.accentDeep}
          strokeWidth={l.strong ? 2 : 1.5}
          strokeDasharray={DASH[l.style]}
        >
          {l.title && <title>{l.title}</title>}
        </polyline>
      ))}
      {m.marks.map((k) => (
        <g key={k.key} data-mark={k.key}>
          <ShapeMark x={k.x} y={k.y} shape={k.shape} />
          <title>{k.title}</title>
        </g>
      ))}
      {m.labels.map((l) => (
        <text
          key={l.key}
          x={l.x}
          y={l.y}
          textAnchor={l.anchor}
          fontFamily={PLOT_FONTS.figures}
          fontSize={11}
          fill={PLOT_COLOURS.graphite}
        >
          {l.text}
        </text>
      ))}
      <AxisLeft
        scale={m.y.scale}
        left={left - 6}
        tickValues={m.y.ticks}
        tickFormat={(v) => m.y.format(Number(v))}
        tickComponent={TickLabel}
        tickLabelProps={{ textAnchor: 'end', dy: 4 }}
        stroke={PLOT_COLOURS.graphiteSoft}
        tickStroke={PLOT_COLOURS.graphiteSoft}
      />
      <AxisBottom
        scale={m.x.scale}
        top={bottom + 6}
        tickValues={m.x.ticks}
        tickFormat={(v) => m.x.format(Number(v))}
        tickComponent={TickLabel}
        tickLabelProps={{ textAnchor: 'middle', dy: 4 }}
        stroke={PLOT_COLOURS.graphiteSoft}
        tickStroke={PLOT_COLOURS.graphiteSoft}
      />
      {m.y.label && (
        <AxisTitle x={16} y={(top + bottom) / 2} rotate>
          {m.y.label}
        </AxisTitle>
      )}
      <AxisTitle x={(left + right) / 2} y={m.height - 10}>
        {m.x.label}
      </AxisTitle>
    </PlotFrame>
  );
}
