import { useMemo } from 'react';
import type { ColumnDef, SortingState } from '@tanstack/react-table';
import type { PartSummary } from '@shared/contracts/parts.ts';
import { CATEGORY_LABELS } from '@shared/contracts/part-attributes.ts';
import { DataTable, type ColumnMeta } from '@/components/ui/data-table.tsx';
import { formatMoney } from '@/lib/format.ts';
import { PartOutline } from './part-outline.tsx';
import { AvailableQty, LifecycleTag } from './part-status.tsx';
import { SkuLink } from './sku-link.tsx';

const right: ColumnMeta = { align: 'right' };

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
  onOpen,
  empty,
}: {
  data: PartSummary[];
  sorting: SortingState;
  onSortingChange: (s: SortingState) => void;
  onOpen: (p: PartSummary) => void;
  empty: string;
}) {
  const columns = useMemo<ColumnDef<PartSummary>[]>(
    () => [
      { id: 'thumb', header: () => <span className="sr-only">Picture</span>, enableSorting: false, cell: (c) => <PartThumb part={c.row.original} size="h-8 w-8" />, meta: { className: 'w-10' } },
      {
        id: 'sku',
        accessorKey: 'sku',
        header: 'SKU',
        // Rows open on Enter or click; the link is for a new tab, so it stays out of the tab order.
        cell: (c) => <SkuLink sku={c.row.original.sku} tabIndex={-1} onClick={(e) => e.stopPropagation()} className="text-[13px]" />,
      },
      {
        id: 'name',
        accessorKey: 'name',
        header: 'Name',
        meta: { className: 'min-w-[12rem]' },
        // The lifecycle tag sits beside the name, where it cannot be missed (and it keeps the table within a laptop screen).
        cell: (c) => {
          const p = c.row.original;
          return (
            <span className="flex flex-wrap items-center gap-x-1.5 gap-y-0.5">
              <span>{p.name}</span>
              {p.packSize > 1 && !/pack of/i.test(p.name) && <span className="text-xs text-ink-soft">pack of {p.packSize}</span>}
              {p.lifecycle !== 'active' && <LifecycleTag lifecycle={p.lifecycle} />}
            </span>
          );
        },
      },
      { id: 'category', accessorKey: 'category', header: 'Category', cell: (c) => CATEGORY_LABELS[c.row.original.category] },
      { id: 'maker', accessorKey: 'makerName', header: 'Maker', cell: (c) => c.row.original.makerName },
      { id: 'gtin', accessorKey: 'gtin', header: 'GTIN', enableSorting: false, cell: (c) => <span className="num text-[11px]">{c.row.original.gtin ?? '—'}</span> },
      { id: 'available', accessorKey: 'available', header: 'Available', enableSorting: false, meta: right, cell: (c) => <AvailableQty available={c.row.original.available} /> },
      {
        id: 'listPrice',
        accessorKey: 'listPriceCents',
        header: 'List price',
        enableSorting: false,
        meta: right,
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
      onOpen={onOpen}
      sorting={sorting}
      onSortingChange={onSortingChange}
      empty={empty}
      cellAlign="middle"
      dense
    />
  );
}
