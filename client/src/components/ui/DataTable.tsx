import { useId, useState, type ReactNode } from 'react';
import {
  flexRender,
  getCoreRowModel,
  getFilteredRowModel,
  getSortedRowModel,
  useReactTable,
  type ColumnDef,
  type FilterFn,
  type SortingState,
} from '@tanstack/react-table';
import { cx } from './cx';

export interface DataTableProps<T> {
  data: T[];
  // TanStack's column helpers produce ColumnDef<T, any>; each column's value type is its own business.
  columns: ColumnDef<T, any>[];
  /** Names the table (visible caption) and its scroll region. */
  caption: string;
  hideCaption?: boolean;
  getRowId: (row: T) => string;
  /** When set, shows a filter box with this label that searches the given text of each row. */
  filter?: { label: string; text: (row: T) => string; placeholder?: string };
  empty: string;
  noun?: { one: string; many: string };
  initialSorting?: SortingState;
  /** More filters beside the search box (e.g. a status choice); the caller narrows `data` itself. */
  toolbar?: ReactNode;
  /** The width below which the table scrolls sideways; narrower tables can pass e.g. 'min-w-[44rem]'. */
  minWidthClass?: string;
}

/**
 * Dense, sortable table for staff screens. On a narrow phone the table scrolls sideways inside its
 * own focusable region, so the page itself never does.
 */
export function DataTable<T>({
  data,
  columns,
  caption,
  hideCaption,
  getRowId,
  filter,
  empty,
  noun = { one: 'row', many: 'rows' },
  initialSorting = [],
  toolbar,
  minWidthClass = 'min-w-[64rem]',
}: DataTableProps<T>) {
  const filterId = useId();
  const [sorting, setSorting] = useState<SortingState>(initialSorting);
  const [globalFilter, setGlobalFilter] = useState('');

  const matchesText: FilterFn<T> = (row, _columnId, query: string) => {
    if (!filter) return true;
    return filter.text(row.original).toLowerCase().includes(query.trim().toLowerCase());
  };

  // The app does not run the React Compiler, so the table's unmemoizable functions are harmless here.
  // eslint-disable-next-line react-hooks/incompatible-library
  const table = useReactTable({
    data,
    columns,
    state: { sorting, globalFilter },
    onSortingChange: setSorting,
    onGlobalFilterChange: setGlobalFilter,
    globalFilterFn: matchesText,
    getRowId: (row) => getRowId(row),
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getFilteredRowModel: getFilteredRowModel(),
  });

  const rows = table.getRowModel().rows;
  const count = (n: number) => `${n} ${n === 1 ? noun.one : noun.many}`;

  return (
    <div>
      {(filter || toolbar) && (
        <div className="mb-3 flex flex-wrap items-end gap-3">
          {filter && (
            <div className="w-full max-w-xs">
              <label htmlFor={filterId} className="block text-sm font-semibold">
                {filter.label}
              </label>
              <input
                id={filterId}
                type="search"
                value={globalFilter}
                placeholder={filter.placeholder}
                onChange={(e) => setGlobalFilter(e.target.value)}
                className="mt-1 block min-h-10 w-full rounded-md border border-rule-strong bg-sheet px-3 text-sm"
              />
            </div>
          )}
          {toolbar}
          <p className="pb-2 text-sm text-muted tabular-nums" aria-live="polite">
            {globalFilter ? `Showing ${rows.length} of ${count(data.length)}` : count(data.length)}
          </p>
        </div>
      )}
      <div role="region" aria-label={caption} tabIndex={0} className="overflow-x-auto rounded-lg border border-rule bg-sheet">
        <table className={cx('w-full border-collapse text-left text-sm', minWidthClass)}>
          <caption className={cx('px-3 pt-3 text-left font-semibold', hideCaption && 'sr-only')}>{caption}</caption>
          <thead>
            {table.getHeaderGroups().map((group) => (
              <tr key={group.id} className="border-b border-rule bg-shade">
                {group.headers.map((header) => {
                  const sorted = header.column.getIsSorted();
                  const canSort = header.column.getCanSort();
                  const title = flexRender(header.column.columnDef.header, header.getContext());
                  return (
                    <th
                      key={header.id}
                      scope="col"
                      aria-sort={sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : undefined}
                      className="px-3 py-2 font-semibold whitespace-nowrap"
                    >
                      {header.isPlaceholder ? null : canSort ? (
                        <button
                          type="button"
                          onClick={header.column.getToggleSortingHandler()}
                          className="inline-flex items-center gap-1 rounded hover:underline"
                        >
                          {title}
                          <span aria-hidden="true" className="text-muted">
                            {sorted === 'asc' ? '↑' : sorted === 'desc' ? '↓' : '↕'}
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
            {rows.length === 0 ? (
              <tr>
                <td colSpan={table.getAllLeafColumns().length} className="px-3 py-4 text-ink-2">
                  {globalFilter ? 'Nothing matches that filter.' : empty}
                </td>
              </tr>
            ) : (
              rows.map((row) => (
                <tr key={row.id} className="border-b border-rule last:border-b-0 align-top">
                  {row.getVisibleCells().map((cell) => (
                    <td key={cell.id} className="px-3 py-2">
                      {flexRender(cell.column.columnDef.cell, cell.getContext())}
                    </td>
                  ))}
                </tr>
              ))
            )}
          </tbody>
        </table>
      </div>
    </div>
  );
}
