import type { ReactNode } from 'react';

/**
 * The app's plain table: a bordered card, a header row of column names, and the rows given as
 * children. Dense but calm; scrolls sideways on a narrow screen instead of squeezing.
 */
export function DataTable({
  columns,
  children,
  label,
}: {
  columns: ReactNode[];
  children: ReactNode;
  label?: string;
}) {
  return (
    <div className="relative overflow-x-auto rounded-lg border border-rule bg-card">
      <table aria-label={label} className="w-full text-left text-sm">
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
