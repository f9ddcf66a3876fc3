import type { ResolvedReading } from '@shared/document/evaluate';
import { HOLD_POINT_WORDS } from '@shared/document/nodes';

/** Consecutive readings as one table: what, where, meter range, expected band; live ones say so. */
export function ReadingsTable({
  readings,
  live = new Set(),
  holdPoints = new Set(),
}: {
  readings: ResolvedReading[];
  live?: ReadonlySet<string>;
  /** Readings where an out-of-band value stops a bench run until a senior decides. */
  holdPoints?: ReadonlySet<string>;
}) {
  return (
    // A box that may scroll sideways is focusable and named, so a keyboard can scroll it too.
    <div
      role="region"
      aria-label={`Readings to take, from “${readings[0]?.label ?? ''}”`}
      tabIndex={0}
      className="not-prose my-4 relative overflow-x-auto rounded-lg border border-rule bg-card"
    >
      <table className="readings-table w-full text-left text-sm">
        <caption className="sr-only">Readings to take</caption>
        <thead className="border-b border-rule bg-paper-deep">
          <tr>
            <th scope="col" className="px-3 py-2">
              Measure
            </th>
            <th scope="col" className="px-3 py-2">
              Where
            </th>
            <th scope="col" className="px-3 py-2">
              Meter range
            </th>
            <th scope="col" className="px-3 py-2">
              Expected
            </th>
            <th scope="col" className="px-3 py-2">
              Band
            </th>
          </tr>
        </thead>
        <tbody>
          {readings.map((r) => (
            <tr key={r.id} data-reading={r.id} className="border-b border-rule align-top last:border-0">
              <td className="px-3 py-2 font-semibold">
                {r.label || 'Untitled reading'}
                {live.has(r.id) && (
                  <span className="block text-xs font-normal text-graphite-soft">
                    Live work: unit powered
                  </span>
                )}
                {holdPoints.has(r.id) && (
                  <span data-hold-point-marker className="block text-xs text-out">
                    <strong className="uppercase">Hold point</strong>: {HOLD_POINT_WORDS}
                  </span>
                )}
              </td>
              <td className="px-3 py-2">{r.testPoint}</td>
              <td className="value px-3 py-2">{r.meterRange}</td>
              <td className="px-3 py-2">
                {/* The result it uses by its label, never the internal "block.output" reference. */}
                <span className="value">{r.expectedText ?? r.expectedSource}</span>
                <span className="block text-xs text-graphite-soft">
                  tolerance <span className="value">{r.toleranceText || 'none'}</span>
                </span>
              </td>
              <td className="px-3 py-2">
                {r.bandText ? (
                  <span className="value font-semibold">{r.bandText}</span>
                ) : (
                  <span className="text-out">No band: {r.error}</span>
                )}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
