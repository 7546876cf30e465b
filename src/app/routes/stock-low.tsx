import { useMemo } from 'react';
import type { ColumnDef } from '@tanstack/react-table';
import type { LowStock } from '@shared/contracts/stock.ts';
import { Page } from '@/components/ui/page.tsx';
import { Notice } from '@/components/ui/notice.tsx';
import { DataTable, PHONE_HIDDEN } from '@/components/ui/data-table.tsx';
import { useLowStock } from '@/features/stock/api/get-low-stock.ts';

/** Parts at or below their minimum, counting what backorders already claim. */
export function StockLowRoute() {
  const low = useLowStock();
  const columns = useMemo<ColumnDef<LowStock>[]>(
    () => [
      { id: 'sku', accessorKey: 'sku', header: 'SKU',
        cell: (c) => (
          <>
            <span className="num font-semibold">{c.row.original.sku}</span>
            <span className="block text-xs text-ink-soft sm:hidden">
              {c.row.original.name}
              {c.row.original.backordered > 0 && <span className="block font-semibold text-danger">{c.row.original.backordered} backordered</span>}
            </span>
          </>
        ),
      },
      { id: 'name', accessorKey: 'name', header: 'Part', meta: { className: PHONE_HIDDEN } },
      { id: 'onHand', accessorKey: 'onHand', header: 'On hand', meta: { align: 'right', className: PHONE_HIDDEN }, cell: (c) => <span className="num">{c.row.original.onHand}</span> },
      { id: 'available', accessorKey: 'available', header: 'Available', meta: { align: 'right' }, cell: (c) => <span className="num">{c.row.original.available}</span> },
      { id: 'backordered', accessorKey: 'backordered', header: 'Backordered', meta: { align: 'right', className: PHONE_HIDDEN }, cell: (c) => <span className={`num ${c.row.original.backordered ? 'font-semibold text-danger' : ''}`}>{c.row.original.backordered}</span> },
      { id: 'min', accessorKey: 'min', header: 'Min', meta: { align: 'right', className: PHONE_HIDDEN }, cell: (c) => <span className="num">{c.row.original.min}</span> },
      { id: 'max', accessorKey: 'max', header: 'Max', meta: { align: 'right', className: PHONE_HIDDEN }, cell: (c) => <span className="num">{c.row.original.max}</span> },
      { id: 'toMax', accessorKey: 'toMax', header: 'To max', meta: { align: 'right' }, cell: (c) => <span className="num font-semibold">{c.row.original.toMax}</span> },
    ],
    [],
  );
  return (
    <Page title="Low stock" subtitle="Available less backorders, against each part’s minimum (all warehouses).">
      {low.error && <Notice tone="danger">{low.error.message}</Notice>}
      <DataTable label="Low stock" data={low.data ?? []} columns={columns} getRowId={(l) => l.sku} dense empty={low.isLoading ? 'Loading…' : 'Nothing is below its minimum.'} />
    </Page>
  );
}
