import type { TrendPoint } from '@shared/schemas/units';
import { formatQuantity } from '@shared/units';

/** One reading across visits: the band at each visit's mains shaded, expected dashed, each measurement marked. */
export function TrendPlot({ points, unit, label }: { points: TrendPoint[]; unit: string; label: string }) {
  if (!points.length)
    return <p className="text-sm text-graphite-soft">No measurements of this reading yet.</p>;
  const W = 640;
  const H = 260;
  // Right padding leaves room for the last visit's centred date label.
  const pad = { l: 70, r: 56, t: 16, b: 44 };
  const values = points.flatMap((p) =>
    [p.measured, p.low, p.high, p.expected].filter((v): v is number => v !== null),
  );
  let lo = Math.min(...values);
  let hi = Math.max(...values);
  if (hi === lo) {
    hi += Math.abs(hi) * 0.05 || 1;
    lo -= Math.abs(lo) * 0.05 || 1;
  }
  const span = hi - lo;
  lo -= span * 0.1;
  hi += span * 0.1;
  const x = (i: number) =>
    pad.l + (points.length === 1 ? (W - pad.l - pad.r) / 2 : (i / (points.length - 1)) * (W - pad.l - pad.r));
  const y = (v: number) => pad.t + (1 - (v - lo) / (hi - lo)) * (H - pad.t - pad.b);
  const banded = points.map((p, i) => ({ ...p, i })).filter((p) => p.low !== null && p.high !== null);
  const bandPath = banded.length
    ? `M ${banded.map((p) => `${x(p.i)},${y(p.high!)}`).join(' L ')} L ${[...banded]
        .reverse()
        .map((p) => `${x(p.i)},${y(p.low!)}`)
        .join(' L ')} Z`
    : '';
  const expected = points.map((p, i) => ({ ...p, i })).filter((p) => p.expected !== null);
  const ticks = [lo + (hi - lo) * 0.1, (lo + hi) / 2, hi - (hi - lo) * 0.1];
  return (
    <figure>
      <svg
        role="img"
        aria-label={`${label} across visits`}
        viewBox={`0 0 ${W} ${H}`}
        className="w-full max-w-3xl font-mono text-[11px]"
      >
        {bandPath && <path d={bandPath} className="fill-accent-wash stroke-accent" strokeWidth={0.5} />}
        {banded.length === 1 && (
          <line
            x1={x(banded[0]!.i)}
            x2={x(banded[0]!.i)}
            y1={y(banded[0]!.high!)}
            y2={y(banded[0]!.low!)}
            className="stroke-accent"
            strokeWidth={10}
            opacity={0.25}
          />
        )}
        {expected.length > 1 && (
          <polyline
            points={expected.map((p) => `${x(p.i)},${y(p.expected!)}`).join(' ')}
            fill="none"
            className="stroke-accent-deep"
            strokeDasharray="5 4"
          />
        )}
        {ticks.map((t) => (
          <g key={t}>
            <line
              x1={pad.l}
              x2={W - pad.r}
              y1={y(t)}
              y2={y(t)}
              className="stroke-rule"
              strokeDasharray="2 4"
            />
            <text x={pad.l - 6} y={y(t) + 4} textAnchor="end" className="fill-graphite-soft">
              {formatQuantity(t, unit, 3)}
            </text>
          </g>
        ))}
        <polyline
          points={points.map((p, i) => `${x(i)},${y(p.measured)}`).join(' ')}
          fill="none"
          className="stroke-graphite"
          strokeWidth={1.5}
        />
        {points.map((p, i) => (
          <g key={p.runId}>
            <circle
              cx={x(i)}
              cy={y(p.measured)}
              r={6}
              className={p.within === false ? 'fill-out' : p.within ? 'fill-ok' : 'fill-graphite-soft'}
            />
            <text x={x(i)} y={H - pad.b + 16} textAnchor="middle" className="fill-graphite-soft">
              {new Date(p.at).toLocaleDateString()}
            </text>
            <text x={x(i)} y={H - pad.b + 30} textAnchor="middle" className="fill-graphite-soft">
              {formatQuantity(p.mainsVoltage, 'V', 3)} mains
            </text>
            <title>{`${new Date(p.at).toLocaleString()}: ${formatQuantity(p.measured, unit, 4)}${p.low !== null ? ` (band ${formatQuantity(p.low, unit, 4)} … ${formatQuantity(p.high!, unit, 4)})` : ''}`}</title>
          </g>
        ))}
      </svg>
      <figcaption className="mt-1 text-xs text-graphite-soft">
        Shaded: the tolerance band at each visit’s measured mains. Dashed: expected value. Points: measured (
        {'●'} within, red out of tolerance).
      </figcaption>
    </figure>
  );
}
