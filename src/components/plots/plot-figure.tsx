import type { ReactNode } from 'react';

/**
 * A plot on the page: the drawing (an SVG with its own accessible name and description), what it
 * shows in words, and the plotted figures as a table, for anyone who cannot see the drawing
 * (WCAG 2.1 SC 1.1.1, docs/references.md §11).
 */
export function PlotFigure({
  plot,
  label,
  caption,
  notes = [],
  table,
}: {
  plot: ReactNode;
  /** The plot's title, naming the box that scrolls it sideways on a narrow screen. */
  label: string;
  caption: string;
  notes?: string[];
  table: { label: string; columns: string[]; rows: { key: string; cells: string[] }[] };
}) {
  return (
    <figure className="flex max-w-3xl flex-col gap-2">
      {/* On a phone the drawing keeps a legible size and scrolls sideways; the box takes keyboard focus so it can be scrolled without a pointer. */}
      <div
        tabIndex={0}
        role="group"
        aria-label={`${label}, scrolls sideways on a narrow screen`}
        className="overflow-x-auto rounded-lg border border-rule bg-card p-2"
      >
        {plot}
      </div>
      <figcaption className="text-xs text-graphite-soft">{caption}</figcaption>
      {notes.length > 0 && (
        <ul className="text-xs text-graphite-soft">
          {notes.map((n) => (
            <li key={n}>Not plotted: {n}</li>
          ))}
        </ul>
      )}
      <details className="text-sm print:hidden" data-plot-table>
        <summary className="inline-flex min-h-11 cursor-pointer items-center font-semibold text-accent-deep">
          {table.label}
        </summary>
        <table className="mt-1 w-full text-left">
          <thead className="border-b border-rule bg-paper-deep">
            <tr>
              {table.columns.map((c) => (
                <th key={c} scope="col" className="px-2 py-1">
                  {c}
                </th>
              ))}
            </tr>
          </thead>
          <tbody>
            {table.rows.map((r) => (
              <tr key={r.key} className="border-b border-rule last:border-0">
                {r.cells.map((c, i) =>
                  i === 0 ? (
                    <th key={i} scope="row" className="px-2 py-1 font-normal">
                      {c}
                    </th>
                  ) : (
                    <td key={i} className="px-2 py-1 font-mono tabular-nums">
                      {c}
                    </td>
                  ),
                )}
              </tr>
            ))}
          </tbody>
        </table>
      </details>
    </figure>
  );
}
