import { useMemo } from 'react';
import type { ColumnDef, SortingState } from '@tanstack/react-table';
import type { PartSummary } from '@shared/contracts/parts.ts';
import { CATEGORY_LABELS } from '@shared/contracts/part-attributes.ts';
import { DataTable, ROW_ACTION, type ColumnMeta } from '@/components/ui/data-table.tsx';
import { formatMoney } from '@/lib/format.ts';
import { PartOutline } from './part-outline.tsx';
import { AvailableQty, LifecycleTag } from './part-status.tsx';
import { SkuLink } from '@/components/ui/sku-link.tsx';

const right: ColumnMeta = { align: 'right' };
/** Columns a phone leaves out, so a row fits 390 px: SKU, name, availability and price stay. */
const PHONE_HIDDEN: ColumnMeta = { className: 'max-sm:hidden' };

export function PartThumb({ part, size = 'h-9 w-9' }: { part: Pick<PartSummary, 'thumbnailUrl' | 'category'>; size?: string }) {
  return part.thumbnailUrl ? (
    <img src={part.thumbnailUrl} alt="" loading="lazy" className={`${size} rounded border border-line bg-white object-contain`} />
  ) : (
    <span className={`${size} inline-flex items-center justify-center rounded border border-line bg-paper p-0.5 text-ink-soft`}>
      <PartOutline category={part.category} className="h-full w-full" stroke={1.1} />
    </span>
  );
}

/** Search results. Sorting is the server's: the table only reports which column was clicked. */
export function PartsTable({
  data,
  sorting,
  onSortingChange,
  empty,
}: {
  data: PartSummary[];
  sorting: SortingState;
  onSortingChange: (s: SortingState) => void;
  empty: string;
}) {
  const columns = useMemo<ColumnDef<PartSummary>[]>(
    () => [
      { id: 'thumb', header: () => <span className="sr-only">Picture</span>, enableSorting: false, cell: (c) => <PartThumb part={c.row.original} size="h-8 w-8" />, meta: { className: 'w-10 max-sm:hidden' } },
      {
        id: 'sku',
        accessorKey: 'sku',
        header: 'SKU',
        // The row's one tab stop: ↑/↓ move between parts, Enter opens (the table does the rest).
        cell: (c) => <SkuLink sku={c.row.original.sku} {...ROW_ACTION} className="text-[13px]" />,
      },
      {
        id: 'name',
        accessorKey: 'name',
        header: 'Name',
        meta: { className: 'sm:min-w-[12rem]' },
        // The lifecycle tag sits beside the name, where it cannot be missed (and it keeps the table within a laptop screen).
        cell: (c) => {
          const p = c.row.original;
          return (
            <span className="flex flex-wrap items-center gap-x-1.5 gap-y-0.5">
              <span>{p.name}</span>
              {p.packSize > 1 && !/pack of/i.test(p.name) && <span className="text-xs text-ink-soft">pack of {p.packSize}</span>}
              {p.lifecycle !== 'active' && <LifecycleTag lifecycle={p.lifecycle} />}
              {/* A phone has no room for the price column: the price rides with the name. */}
              {p.listPriceCents !== null && <span className="num w-full text-xs text-ink-soft sm:hidden">{formatMoney(p.listPriceCents)}</span>}
            </span>
          );
        },
      },
      { id: 'category', accessorKey: 'category', header: 'Category', meta: PHONE_HIDDEN, cell: (c) => CATEGORY_LABELS[c.row.original.category] },
      { id: 'maker', accessorKey: 'makerName', header: 'Maker', meta: PHONE_HIDDEN, cell: (c) => c.row.original.makerName },
      { id: 'gtin', accessorKey: 'gtin', header: 'GTIN', enableSorting: false, meta: PHONE_HIDDEN, cell: (c) => <span className="num text-[11px]">{c.row.original.gtin ?? '—'}</span> },
      { id: 'available', accessorKey: 'available', header: 'Available', enableSorting: false, meta: right, cell: (c) => <AvailableQty available={c.row.original.available} /> },
      {
        id: 'listPrice',
        accessorKey: 'listPriceCents',
        header: 'List price',
        enableSorting: false,
        meta: { ...right, ...PHONE_HIDDEN },
        cell: (c) => <span className="num whitespace-nowrap">{c.row.original.listPriceCents === null ? '—' : formatMoney(c.row.original.listPriceCents)}</span>,
      },
    ],
    [],
  );
  return (
    <DataTable
      label="Parts"
      data={data}
      columns={columns}
      getRowId={(p) => p.sku}
      sorting={sorting}
      onSortingChange={onSortingChange}
      empty={empty}
      cellAlign="middle"
      dense
    />
  );
}
