import type { ReactNode } from 'react';
import type { TickRendererProps } from '@visx/axis';
import { PLOT_COLOURS, PLOT_FONTS } from './theme';

/** How a plotted reading is marked: by shape as well as colour (WCAG 2.1 SC 1.4.1, docs/references.md §11). */
export type MarkerKind = 'within' | 'out' | 'none';

/** In band: a filled circle; out of band: a triangle pointing up (the ▲ of the mark); no band: a ring. */
export function Marker({ x, y, kind, r = 6 }: { x: number; y: number; kind: MarkerKind; r?: number }) {
  if (kind === 'out')
    return (
      <polygon
        data-marker="out"
        points={`${x},${y - r * 1.25} ${x + r * 1.15},${y + r * 0.85} ${x - r * 1.15},${y + r * 0.85}`}
        fill={PLOT_COLOURS.out}
        stroke={PLOT_COLOURS.card}
        strokeWidth={1}
      />
    );
  return kind === 'within' ? (
    <circle data-marker="within" cx={x} cy={y} r={r} fill={PLOT_COLOURS.ok} stroke={PLOT_COLOURS.card} />
  ) : (
    <circle
      data-marker="none"
      cx={x}
      cy={y}
      r={r - 1}
      fill={PLOT_COLOURS.card}
      stroke={PLOT_COLOURS.graphiteSoft}
      strokeWidth={2}
    />
  );
}

/**
 * Tick labels as plain <text> (no nested <svg> or inline style), so svg-to-pdfkit draws them as the
 * page does; a label with a line break gets a line each.
 */
export function TickLabel({ x, y, formattedValue, textAnchor, dy }: TickRendererProps) {
  return (
    <text
      x={x}
      y={y}
      dy={dy}
      textAnchor={textAnchor}
      fontFamily={PLOT_FONTS.figures}
      fontSize={11}
      fill={PLOT_COLOURS.graphiteSoft}
    >
      {formattedValue?.split('\n').map((line, i) => (
        <tspan key={i} x={x} dy={i ? '1.3em' : undefined}>
          {line}
        </tspan>
      ))}
    </text>
  );
}

/** An axis title with its unit. */
export function AxisTitle({
  x,
  y,
  children,
  rotate = false,
}: {
  x: number;
  y: number;
  children: string;
  rotate?: boolean;
}) {
  return (
    <text
      x={x}
      y={y}
      transform={rotate ? `rotate(-90 ${x} ${y})` : undefined}
      textAnchor="middle"
      fontFamily={PLOT_FONTS.words}
      fontSize={12}
      fill={PLOT_COLOURS.graphite}
    >
      {children}
    </text>
  );
}

/** The legend inside the drawing, so the page and the PDF explain the marks alike. */
export function Legend({
  x,
  y,
  items,
}: {
  x: number;
  y: number;
  items: { kind: MarkerKind | 'band'; text: string }[];
}) {
  let at = x;
  return (
    <g data-legend="">
      {items.map((item) => {
        const start = at;
        at += 28 + item.text.length * 6.2;
        return (
          <g key={item.kind}>
            {item.kind === 'band' ? (
              <rect
                x={start - 7}
                y={y - 7}
                width={14}
                height={14}
                fill={PLOT_COLOURS.accentWash}
                stroke={PLOT_COLOURS.accent}
              />
            ) : (
              <Marker x={start} y={y} kind={item.kind} r={5} />
            )}
            <text
              x={start + 12}
              y={y + 4}
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
  );
}

/**
 * The root of every plot: an `img` named by its title and described by its description, sized by
 * its layout, so every plot is announced the same way on the page and in the PDF.
 */
export function PlotFrame({
  id,
  kind,
  width,
  height,
  title,
  description,
  className,
  children,
}: {
  id: string;
  kind: string;
  width: number;
  height: number;
  title: string;
  description: string;
  className?: string;
  children: ReactNode;
}) {
  return (
    <svg
      xmlns="http://www.w3.org/2000/svg"
      role="img"
      aria-labelledby={`${id}-title`}
      aria-describedby={`${id}-desc`}
      viewBox={`0 0 ${width} ${height}`}
      width={width}
      height={height}
      className={className}
      data-plot={kind}
    >
      <title id={`${id}-title`}>{title}</title>
      <desc id={`${id}-desc`}>{description}</desc>
      {children}
    </svg>
  );
}
