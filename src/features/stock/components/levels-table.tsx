import { useMemo } from 'react';
import type { ColumnDef } from '@tanstack/react-table';
import type { StockLevel } from '@shared/contracts/stock.ts';
import { Link } from 'react-router';
import { DataTable, PHONE_HIDDEN, ROW_ACTION } from '@/components/ui/data-table.tsx';
import { paths } from '@/config/paths.ts';

/** Stock per part × warehouse × bin: on hand, reserved, available, on order. */
/** A row opens the part's movements. */
export function LevelsTable({ levels }: { levels: StockLevel[] }) {
  const columns = useMemo<ColumnDef<StockLevel>[]>(
    () => [
      { id: 'sku', accessorKey: 'sku', header: 'SKU', cell: (c) => (
          <>
            <Link {...ROW_ACTION} to={paths.stockMovements.href(new URLSearchParams({ sku: c.row.original.sku }).toString())} className="num font-semibold hover:text-copper hover:underline">
              {c.row.original.sku}
            </Link>
            <span className="block text-xs text-ink-soft sm:hidden">{c.row.original.name}</span>
          </>
        ),
      },
      { id: 'name', accessorKey: 'name', header: 'Part', meta: { className: `min-w-48 ${PHONE_HIDDEN}` } },
      { id: 'warehouse', accessorKey: 'warehouse', header: 'Warehouse', meta: { className: PHONE_HIDDEN }, cell: (c) => <span className="num">{c.row.original.warehouse}</span> },
      {
        id: 'bin',
        accessorKey: 'bin',
        header: 'Bin',
        cell: (c) => (
          <span className="num whitespace-nowrap">
            <span className="block text-xs text-ink-soft sm:hidden">{c.row.original.warehouse}</span>
            {c.row.original.bin}
            {c.row.original.isDefaultBin && <span title="Default bin"> ★</span>}
          </span>
        ),
      },
      { id: 'onHand', accessorKey: 'onHand', header: 'On hand', meta: { align: 'right' }, cell: (c) => <span className="num">{c.row.original.onHand}</span> },
      { id: 'reserved', accessorKey: 'reserved', header: 'Reserved', meta: { align: 'right', className: PHONE_HIDDEN }, cell: (c) => <span className="num">{c.row.original.reserved}</span> },
      {
        id: 'available',
        accessorKey: 'available',
        header: 'Available',
        meta: { align: 'right' },
        cell: (c) => (c.row.original.available > 0 ? <span className="num font-semibold text-teal">{c.row.original.available}</span> : <span className="num font-semibold text-danger">✕ 0</span>),
      },
      { id: 'onOrder', accessorKey: 'onOrder', header: 'On order', meta: { align: 'right', className: PHONE_HIDDEN }, cell: (c) => <span className="num">{c.row.original.onOrder}</span> },
    ],
    [],
  );
  return <DataTable label="Stock levels" data={levels} columns={columns} getRowId={(l) => `${l.sku}|${l.warehouse}|${l.bin}`} dense empty="No stock matches." />;
}
