import { useLayoutEffect, useRef, useState, type FocusEvent, type KeyboardEvent, type MouseEvent } from 'react';
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
  getRowId?: (row: T) => string;
  empty?: string;
  label: string;
  /** When the server sorts, pass manual sorting through. */
  sorting?: SortingState;
  /** The order the rows arrive in (e.g. newest first), shown as the sorted column until someone sorts. */
  initialSorting?: SortingState;
  onSortingChange?: (s: SortingState) => void;
  /** Vertical alignment of cells; 'middle' suits rows with a thumbnail. */
  cellAlign?: 'top' | 'middle';
  /** Tighter cell padding, for tables with many columns. */
  dense?: boolean;
}

/** A column's class for what a phone (under 640 px) leaves out; fold what matters into another cell. */
export const PHONE_HIDDEN = 'max-sm:hidden';

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

/** Marks the one link or button in a row that opens it (the catalogue's SKU, a plan's name). */
export const ROW_ACTION = { 'data-row-action': '' } as const;
const ROW_ACTION_SELECTOR = '[data-row-action]';

const isControl = (el: EventTarget) => el instanceof Element && !!el.closest('a, button, input, select, textarea, label');

/**
 * Dense table: sticky header, sortable columns. A row opens through a real link or button in it
 * (spread `ROW_ACTION` on it): one Tab stop for the whole table (the current row's), ↑/↓ move
 * between rows, Enter follows it. A click anywhere on the row does the same, for the mouse.
 */
export function DataTable<T>({ data, columns, getRowId, empty = 'Nothing here yet.', label, sorting: controlled, initialSorting = [], onSortingChange, cellAlign = 'top', dense = false }: DataTableProps<T>) {
  const [localSorting, setLocalSorting] = useState<SortingState>(initialSorting);
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
  const actions = () => Array.from(body.current?.querySelectorAll<HTMLElement>(ROW_ACTION_SELECTOR) ?? []);
  const [current, setCurrent] = useState(0);

  // Roving tab stop: only the current row's action is in the tab order.
  useLayoutEffect(() => {
    const all = actions();
    all.forEach((el, i) => (el.tabIndex = i === Math.min(current, all.length - 1) ? 0 : -1));
  });

  const onKey = (e: KeyboardEvent<HTMLTableSectionElement>) => {
    const all = actions();
    const i = all.indexOf(e.target as HTMLElement);
    if (i < 0) return;
    const to = e.key === 'ArrowDown' ? i + 1 : e.key === 'ArrowUp' ? i - 1 : e.key === 'Home' ? 0 : e.key === 'End' ? all.length - 1 : -1;
    if (to < 0 || to >= all.length) return;
    e.preventDefault();
    setCurrent(to);
    all[to]!.focus();
  };
  const onFocus = (e: FocusEvent<HTMLTableSectionElement>) => {
    const i = actions().indexOf(e.target as HTMLElement);
    if (i >= 0) setCurrent(i);
  };
  const onRowClick = (e: MouseEvent<HTMLTableRowElement>) => {
    if (isControl(e.target) || window.getSelection()?.toString()) return;
    e.currentTarget.querySelector<HTMLElement>(ROW_ACTION_SELECTOR)?.click();
  };
  const shownSorting = sorting.length ? sorting : initialSorting;

  return (
    <div className="max-h-[70vh] overflow-auto rounded-lg border border-line bg-card">
      <table className="w-full border-collapse text-sm" aria-label={label}>
        <thead className="sticky top-0 z-10 bg-[#efece4]">
          {table.getHeaderGroups().map((hg) => (
            <tr key={hg.id}>
              {hg.headers.map((h) => {
                const sorted = h.column.getIsSorted() || (shownSorting[0]?.id === h.column.id ? (shownSorting[0].desc ? 'desc' : 'asc') : false);
                return (
                  <th key={h.id} scope="col" aria-sort={sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : undefined} className={`border-b border-line ${dense ? 'px-2' : 'px-2 sm:px-3'} py-2 text-xs font-semibold uppercase tracking-wide text-ink-soft ${metaClass(h.column.columnDef.meta)}`}>
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
        <tbody ref={body} onKeyDown={onKey} onFocus={onFocus}>
          {table.getRowModel().rows.map((row) => (
            <tr key={row.id} onClick={onRowClick} className="border-b border-line/70 last:border-0 has-[[data-row-action]]:cursor-pointer hover:bg-paper focus-within:bg-amber-soft">
              {row.getVisibleCells().map((cell) => (
                <td key={cell.id} className={`${dense ? 'px-2 py-1' : 'px-2 py-1.5 sm:px-3'} ${cellAlign === 'middle' ? 'align-middle' : 'align-top'} ${metaClass(cell.column.columnDef.meta)}`}>
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
