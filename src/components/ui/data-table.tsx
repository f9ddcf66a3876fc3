import type { ReactNode } from 'react';

/**
 * The app's plain table: a bordered card, a header row of column names, and the rows given as
 * children. Dense but calm; scrolls sideways on a narrow screen instead of squeezing. `widths`
 * (one CSS width per column) fixes the layout, so a long name cannot starve a column of figures.
 */
export function DataTable({
  columns,
  children,
  label,
  widths,
  minWidth,
}: {
  columns: ReactNode[];
  children: ReactNode;
  label?: string;
  widths?: string[];
  /** Below this width the table scrolls sideways rather than squeezing its columns (with `widths`). */
  minWidth?: string;
}) {
  return (
    // A box that may scroll is focusable and named, so a keyboard can scroll it too.
    <div
      className="relative overflow-x-auto rounded-lg border border-rule bg-card"
      {...(label ? { role: 'region', 'aria-label': label, tabIndex: 0 } : {})}
    >
      <table
        aria-label={label}
        className={`w-full text-left text-sm ${widths ? 'table-fixed' : ''}`}
        style={minWidth ? { minWidth } : undefined}
      >
        {widths && (
          <colgroup>
            {widths.map((w, i) => (
              <col key={i} style={{ width: w }} />
            ))}
          </colgroup>
        )}
        <thead className="border-b border-rule bg-paper-deep">
          <tr>
            {columns.map((c, i) => (
              <th key={i} scope="col" className="px-3 py-2">
                {c}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>{children}</tbody>
      </table>
    </div>
  );
}
