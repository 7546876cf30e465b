import { useRef, useState, type KeyboardEvent } from 'react';
import {
  flexRender,
  getCoreRowModel,
  getSortedRowModel,
  useReactTable,
  type ColumnDef,
  type SortingState,
} from '@tanstack/react-table';

interface DataTableProps<T> {
  data: T[];
  columns: ColumnDef<T, any>[]; // eslint-disable-line @typescript-eslint/no-explicit-any
  /** Enter or click on a row. */
  onOpen?: (row: T) => void;
  getRowId?: (row: T) => string;
  empty?: string;
  label: string;
  /** When the server sorts, pass manual sorting through. */
  sorting?: SortingState;
  onSortingChange?: (s: SortingState) => void;
  /** Vertical alignment of cells; 'middle' suits rows with a thumbnail. */
  cellAlign?: 'top' | 'middle';
  /** Tighter cell padding, for tables with many columns. */
  dense?: boolean;
}

/** Per-column extras, set as `meta` on a column definition. */
export interface ColumnMeta {
  /** 'right' for quantities and money, so the digits line up. */
  align?: 'left' | 'right';
  /** Extra classes for the column's header and cells (width, wrapping). */
  className?: string;
}

const metaClass = (meta: unknown) => {
  const m = meta as ColumnMeta | undefined;
  return `${m?.align === 'right' ? 'text-right' : 'text-left'} ${m?.className ?? ''}`;
};

/** Dense table: sticky header, sortable columns, arrow keys move between rows, Enter opens. */
export function DataTable<T>({ data, columns, onOpen, getRowId, empty = 'Nothing here yet.', label, sorting: controlled, onSortingChange, cellAlign = 'top', dense = false }: DataTableProps<T>) {
  const [localSorting, setLocalSorting] = useState<SortingState>([]);
  const sorting = controlled ?? localSorting;
  const table = useReactTable({
    data,
    columns,
    state: { sorting },
    onSortingChange: (updater) => {
      const next = typeof updater === 'function' ? updater(sorting) : updater;
      (onSortingChange ?? setLocalSorting)(next);
    },
    manualSorting: !!controlled,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getRowId,
  });
  const body = useRef<HTMLTableSectionElement>(null);

  const onKey = (e: KeyboardEvent<HTMLTableRowElement>, row: T) => {
    const rows = Array.from(body.current?.querySelectorAll<HTMLTableRowElement>('tr[tabindex]') ?? []);
    const i = rows.indexOf(e.currentTarget);
    if (e.key === 'ArrowDown') rows[i + 1]?.focus();
    else if (e.key === 'ArrowUp') rows[i - 1]?.focus();
    else if (e.key === 'Enter' && onOpen) onOpen(row);
    else return;
    e.preventDefault();
  };

  return (
    <div className="max-h-[70vh] overflow-auto rounded-lg border border-line bg-card">
      <table className="w-full border-collapse text-sm" aria-label={label}>
        <thead className="sticky top-0 z-10 bg-[#efece4]">
          {table.getHeaderGroups().map((hg) => (
            <tr key={hg.id}>
              {hg.headers.map((h) => {
                const sorted = h.column.getIsSorted();
                return (
                  <th key={h.id} scope="col" aria-sort={sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : undefined} className={`border-b border-line ${dense ? 'px-2' : 'px-3'} py-2 text-xs font-semibold uppercase tracking-wide text-ink-soft ${metaClass(h.column.columnDef.meta)}`}>
                    {h.column.getCanSort() ? (
                      <button type="button" onClick={h.column.getToggleSortingHandler()} className="inline-flex items-center gap-1 uppercase hover:text-ink">
                        {flexRender(h.column.columnDef.header, h.getContext())}
                        <span aria-hidden="true">{sorted === 'asc' ? '▲' : sorted === 'desc' ? '▼' : '↕'}</span>
                      </button>
                    ) : (
                      flexRender(h.column.columnDef.header, h.getContext())
                    )}
                  </th>
                );
              })}
            </tr>
          ))}
        </thead>
        <tbody ref={body}>
          {table.getRowModel().rows.map((row) => (
            <tr
              key={row.id}
              tabIndex={onOpen ? 0 : undefined}
              onKeyDown={onOpen ? (e) => onKey(e, row.original) : undefined}
              onClick={onOpen ? () => onOpen(row.original) : undefined}
              className={`border-b border-line/70 last:border-0 ${onOpen ? 'cursor-pointer hover:bg-paper focus:bg-amber-soft' : ''}`}
            >
              {row.getVisibleCells().map((cell) => (
                <td key={cell.id} className={`${dense ? 'px-2 py-1' : 'px-3 py-1.5'} ${cellAlign === 'middle' ? 'align-middle' : 'align-top'} ${metaClass(cell.column.columnDef.meta)}`}>
                  {flexRender(cell.column.columnDef.cell, cell.getContext())}
                </td>
              ))}
            </tr>
          ))}
          {data.length === 0 && (
            <tr>
              <td colSpan={columns.length} className="px-3 py-6 text-center text-ink-soft">
                {empty}
              </td>
            </tr>
          )}
        </tbody>
      </table>
    </div>
  );
}
