import type { EntryView, RunStep } from '@shared/schemas/runs';
import { formatNumber } from '@shared/units';

/** Deviation as a share of the band on its own side: −100 % is the low limit, +100 % the high limit. */
export function bandShare(measured: number, expected: number, low: number, high: number): number {
  const d = measured - expected;
  const half = d >= 0 ? high - expected : expected - low;
  if (half <= 0) return d === 0 ? 0 : d > 0 ? Infinity : -Infinity;
  return (d / half) * 100;
}

const LIMIT = 200;

/** Every recorded reading against its tolerance band, normalised so all bands line up. */
export function DeviationPlot({ steps, entries }: { steps: RunStep[]; entries: EntryView[] }) {
  const byStep = new Map(entries.map((e) => [e.stepId, e]));
  const rows = steps
    .filter((s) => s.kind === 'reading')
    .map((s) => ({ step: s, entry: byStep.get(s.id) }))
    .filter(
      (r) =>
        r.entry?.measured != null && r.entry.expected != null && r.entry.low != null && r.entry.high != null,
    );
  if (!rows.length)
    return <p className="text-sm text-graphite-soft">No readings with a band recorded yet.</p>;
  const rowH = 26;
  const labelW = 230;
  const plotW = 420;
  const width = labelW + plotW + 20;
  const height = rows.length * rowH + 40;
  const x = (pct: number) =>
    labelW + ((Math.max(-LIMIT, Math.min(LIMIT, pct)) + LIMIT) / (2 * LIMIT)) * plotW;
  return (
    <figure>
      <svg
        role="img"
        aria-label="Measured against expected, as a share of each tolerance band"
        viewBox={`0 0 ${width} ${height}`}
        className="w-full max-w-3xl font-mono text-[11px]"
      >
        <rect
          x={x(-100)}
          y={10}
          width={x(100) - x(-100)}
          height={rows.length * rowH}
          className="fill-accent-wash"
        />
        {[-200, -100, 0, 100, 200].map((t) => (
          <g key={t}>
            <line
              x1={x(t)}
              x2={x(t)}
              y1={10}
              y2={10 + rows.length * rowH}
              className={t === 0 ? 'stroke-accent' : 'stroke-rule'}
              strokeDasharray={t === 0 ? undefined : '3 3'}
            />
            <text x={x(t)} y={rows.length * rowH + 26} textAnchor="middle" className="fill-graphite-soft">
              {t > 0 ? `+${t}` : t} %
            </text>
          </g>
        ))}
        {rows.map(({ step, entry }, i) => {
          const share = bandShare(entry!.measured!, entry!.expected!, entry!.low!, entry!.high!);
          const cy = 10 + i * rowH + rowH / 2;
          const clipped = Math.abs(share) > LIMIT;
          return (
            <g key={step.id} data-plot-step={step.id}>
              <text x={labelW - 8} y={cy + 4} textAnchor="end" className="fill-graphite font-sans">
                {step.position}. {step.text.length > 30 ? `${step.text.slice(0, 29)}…` : step.text}
              </text>
              <circle cx={x(share)} cy={cy} r={6} className={entry!.within ? 'fill-ok' : 'fill-out'} />
              {clipped && (
                <text
                  x={x(share) + (share > 0 ? -10 : 10)}
                  y={cy - 8}
                  textAnchor="middle"
                  className="fill-out"
                >
                  {share > 0 ? '→' : '←'}
                </text>
              )}
              <title>{`${step.text}: ${Number.isFinite(share) ? formatNumber(share, 3) : share > 0 ? '+∞' : '−∞'} % of the band`}</title>
            </g>
          );
        })}
      </svg>
      <figcaption className="mt-1 text-xs text-graphite-soft">
        Each reading placed within its own band: the shaded region is the tolerance band (−100 % at the low
        limit, +100 % at the high limit), the centre line the expected value. Points beyond ±200 % sit at the
        edge with an arrow.
      </figcaption>
    </figure>
  );
}
