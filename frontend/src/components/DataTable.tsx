import {
  flexRender,
  getCoreRowModel,
  getFilteredRowModel,
  getSortedRowModel,
  useReactTable,
  type SortingState,
  type TableOptions,
} from '@tanstack/react-table';
import { useState, type ReactNode } from 'react';
import { cn } from '../lib/cn';

export interface DataTableProps<Row> {
  /** Accessible name of the table, e.g. "Projects". */
  label: string;
  data: Row[];
  /** The columns as useReactTable takes them (each column holds values of its own type). */
  columns: TableOptions<Row>['columns'];
  /** Text of the filter box's label; no filter box when omitted. */
  filterLabel?: string;
  filterPlaceholder?: string;
  initialSorting?: SortingState;
  /** Shown in place of the body when the filter leaves no row. */
  noMatch?: ReactNode;
  getRowId?: (row: Row) => string;
  /** Extra controls shown to the right of the filter box. */
  toolbar?: ReactNode;
}

const SORT_MARK = { asc: '▲', desc: '▼' } as const;

/**
 * A sortable table (click a column header; `aria-sort` tells the state) with an optional filter
 * box that matches any column's text. Built on @tanstack/react-table v8.
 */
export function DataTable<Row>({
  label,
  data,
  columns,
  filterLabel,
  filterPlaceholder,
  initialSorting = [],
  noMatch,
  getRowId,
  toolbar,
}: DataTableProps<Row>) {
  const [sorting, setSorting] = useState<SortingState>(initialSorting);
  const [globalFilter, setGlobalFilter] = useState('');
  // eslint-disable-next-line react-hooks/incompatible-library -- the table is read afresh on every render and never passed to a memo, which is what this library needs
  const table = useReactTable({
    data,
    columns,
    state: { sorting, globalFilter },
    onSortingChange: setSorting,
    onGlobalFilterChange: setGlobalFilter,
    globalFilterFn: 'includesString',
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getFilteredRowModel: getFilteredRowModel(),
    getRowId,
  });
  const rows = table.getRowModel().rows;

  return (
    <div className="flex flex-col gap-3">
      {(filterLabel || toolbar) && (
        <div className="flex items-end justify-between gap-4">
          {filterLabel ? (
            <label className="flex flex-col gap-1">
              <span className="text-xs font-bold tracking-wide text-ink-muted uppercase">{filterLabel}</span>
              <input
                type="search"
                value={globalFilter}
                onChange={(event) => setGlobalFilter(event.target.value)}
                placeholder={filterPlaceholder}
                className="h-9 w-72 rounded-control border border-rule-strong bg-paper-raised px-3 text-sm placeholder:text-ink-faint focus-visible:outline-offset-0"
              />
            </label>
          ) : (
            <span />
          )}
          {toolbar}
        </div>
      )}
      <div className="overflow-x-auto rounded-control border border-rule bg-paper-raised">
        <table aria-label={label} className="w-full border-collapse text-sm">
          <thead>
            {table.getHeaderGroups().map((group) => (
              <tr key={group.id} className="border-b border-rule-strong">
                {group.headers.map((header) => {
                  const sorted = header.column.getIsSorted();
                  const canSort = header.column.getCanSort();
                  const title = flexRender(header.column.columnDef.header, header.getContext());
                  return (
                    <th
                      key={header.id}
                      scope="col"
                      aria-sort={sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : canSort ? 'none' : undefined}
                      className="bg-paper-sunk px-3 py-2 text-left text-xs font-bold tracking-wide text-ink-muted uppercase"
                    >
                      {canSort ? (
                        <button
                          type="button"
                          onClick={header.column.getToggleSortingHandler()}
                          className="inline-flex items-center gap-1 uppercase hover:text-ink"
                        >
                          {title}
                          <span aria-hidden className={cn('text-[0.6rem]', !sorted && 'invisible')}>
                            {sorted ? SORT_MARK[sorted] : SORT_MARK.asc}
                          </span>
                        </button>
                      ) : (
                        title
                      )}
                    </th>
                  );
                })}
              </tr>
            ))}
          </thead>
          <tbody>
            {rows.map((row) => (
              <tr key={row.id} className="border-b border-rule last:border-b-0 hover:bg-paper">
                {row.getVisibleCells().map((cell) => (
                  <td key={cell.id} className="px-3 py-2 align-middle">
                    {flexRender(cell.column.columnDef.cell, cell.getContext())}
                  </td>
                ))}
              </tr>
            ))}
            {rows.length === 0 && (
              <tr>
                <td colSpan={table.getVisibleLeafColumns().length} className="px-3 py-6 text-ink-muted">
                  {noMatch ?? 'Nothing matches the filter.'}
                </td>
              </tr>
            )}
          </tbody>
        </table>
      </div>
    </div>
  );
}
