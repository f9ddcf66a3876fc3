import { Link } from 'react-router-dom';
import {
  createColumnHelper,
  flexRender,
  getCoreRowModel,
  useReactTable,
  type SortingState,
} from '@tanstack/react-table';
import type { ProcedureListItem } from '@shared/schemas/procedures';
import { REVISION_STATE_LABELS } from '@shared/schemas/revision-states';
import { paths } from '@/config/paths';
import { StateBadge } from './state-badge';

const col = createColumnHelper<ProcedureListItem>();

const columns = [
  col.accessor('title', {
    header: 'Title',
    cell: (c) => (
      <Link
        className="font-semibold text-accent-deep underline"
        to={paths.revision.href(c.row.original.approved?.id ?? c.row.original.latest.id)}
      >
        {c.getValue()}
      </Link>
    ),
  }),
  col.accessor((p) => `${p.equipmentFamily} ${p.equipmentModel}`, {
    id: 'equipment',
    header: 'Equipment',
    cell: (c) => (
      <>
        {c.row.original.equipmentFamily}{' '}
        <span className="font-semibold">{c.row.original.equipmentModel}</span>
      </>
    ),
  }),
  col.accessor((p) => p.tags.join(', '), {
    id: 'tags',
    header: 'Tags',
    enableSorting: false,
    cell: (c) => <span className="text-graphite-soft">{c.getValue()}</span>,
  }),
  col.accessor((p) => REVISION_STATE_LABELS[p.latest.state], {
    id: 'state',
    header: 'Latest revision',
    cell: (c) => (
      <Link to={paths.procedure.href(c.row.original.id)} className="inline-flex items-center gap-2">
        <span className="value text-xs">r{c.row.original.latest.number}</span>
        <StateBadge state={c.row.original.latest.state} />
      </Link>
    ),
  }),
  col.accessor('updatedAt', {
    header: 'Last change',
    cell: (c) => <time dateTime={c.getValue()}>{new Date(c.getValue()).toLocaleDateString()}</time>,
  }),
];

/**
 * One page of the procedure list. Sorting happens on the server: the table shows the sort it is
 * given and reports header clicks; column ids are the API's sort names.
 */
export function ProcedureTable({
  procedures,
  sorting,
  onSortingChange,
}: {
  procedures: ProcedureListItem[];
  sorting: SortingState;
  onSortingChange: (s: SortingState) => void;
}) {
  const table = useReactTable({
    data: procedures,
    columns,
    state: { sorting },
    manualSorting: true,
    enableSortingRemoval: false,
    onSortingChange: (updater) => onSortingChange(typeof updater === 'function' ? updater(sorting) : updater),
    getCoreRowModel: getCoreRowModel(),
  });
  return (
    <div className="relative overflow-x-auto rounded-lg border border-rule bg-card">
      <table className="w-full text-left text-sm" aria-label="Procedures">
        <thead className="border-b border-rule bg-paper-deep">
          {table.getHeaderGroups().map((hg) => (
            <tr key={hg.id}>
              {hg.headers.map((h) => {
                const sorted = h.column.getIsSorted();
                return (
                  <th
                    key={h.id}
                    scope="col"
                    aria-sort={
                      h.column.getCanSort()
                        ? sorted === 'asc'
                          ? 'ascending'
                          : sorted === 'desc'
                            ? 'descending'
                            : 'none'
                        : undefined
                    }
                    className="px-3 py-1"
                  >
                    {h.column.getCanSort() ? (
                      <button
                        type="button"
                        className="flex min-h-10 items-center gap-1 font-semibold"
                        onClick={h.column.getToggleSortingHandler()}
                      >
                        {flexRender(h.column.columnDef.header, h.getContext())}
                        <span aria-hidden className="text-xs text-graphite-soft">
                          {sorted === 'asc' ? '▲' : sorted === 'desc' ? '▼' : '↕'}
                        </span>
                      </button>
                    ) : (
                      <span className="flex min-h-10 items-center font-semibold">
                        {flexRender(h.column.columnDef.header, h.getContext())}
                      </span>
                    )}
                  </th>
                );
              })}
            </tr>
          ))}
        </thead>
        <tbody>
          {table.getRowModel().rows.map((row) => (
            <tr key={row.id} className="border-b border-rule last:border-0">
              {row.getVisibleCells().map((cell) => (
                <td key={cell.id} className="px-3 py-2">
                  {flexRender(cell.column.columnDef.cell, cell.getContext())}
                </td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
