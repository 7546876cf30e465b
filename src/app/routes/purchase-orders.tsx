import { useMemo } from 'react';
import { Link } from 'react-router';
import type { ColumnDef } from '@tanstack/react-table';
import { PO_STATUS_LABELS } from '@shared/contracts/purchasing.ts';
import { Page } from '@/components/ui/page.tsx';
import { Notice, StatusTag } from '@/components/ui/notice.tsx';
import { DataTable, PHONE_HIDDEN, ROW_ACTION } from '@/components/ui/data-table.tsx';
import { paths } from '@/config/paths.ts';
import { formatDate, formatMoney } from '@/lib/format.ts';
import { hasAbility, useMe } from '@/features/auth/api/get-me.ts';
import { PurchasingTabs } from '@/features/purchasing/components/purchasing-tabs.tsx';
import { useOrders, type PoSummary } from '@/features/purchasing/api/orders.ts';

/** Purchase orders, newest first; the warehouse opens one to receive it. */
export function PurchaseOrdersRoute() {
  const { data: me } = useMe();
  const orders = useOrders();
  const columns = useMemo<ColumnDef<PoSummary>[]>(
    () => [
      { id: 'number', accessorKey: 'number', header: 'Order', cell: (c) => (
        <>
          <Link {...ROW_ACTION} to={paths.purchaseOrder.href(c.row.original.id)} className="num font-semibold text-copper-dark underline-offset-2 hover:underline">{c.row.original.number}</Link>
          <span className="block text-xs text-ink-soft sm:hidden">{c.row.original.supplier}</span>
        </>
      ) },
      { id: 'status', accessorKey: 'status', header: 'Status', cell: (c) => <StatusTag tone={c.row.original.status === 'received' || c.row.original.status === 'closed' ? 'good' : c.row.original.status === 'draft' ? 'info' : 'caution'}>{PO_STATUS_LABELS[c.row.original.status]}</StatusTag> },
      { id: 'supplier', accessorKey: 'supplier', header: 'Supplier', meta: { className: PHONE_HIDDEN } },
      { id: 'warehouse', accessorKey: 'warehouse', header: 'To', meta: { className: PHONE_HIDDEN } },
      { id: 'units', header: 'Received', meta: { align: 'right' }, cell: (c) => <span className="num">{c.row.original.received} / {c.row.original.units}</span> },
      { id: 'ex', header: 'Ex GST', meta: { align: 'right', className: PHONE_HIDDEN }, cell: (c) => <span className="num">{c.row.original.exCents === null ? '—' : formatMoney(c.row.original.exCents)}</span> },
      { id: 'created', accessorKey: 'createdAt', header: 'Made', meta: { className: PHONE_HIDDEN }, cell: (c) => formatDate(c.row.original.createdAt) },
    ],
    [],
  );
  return (
    <Page title="Purchase orders" subtitle="Draft → sent → part received → received → closed.">
      {hasAbility(me, 'purchasing.manage') && <PurchasingTabs />}
      {orders.error && <Notice tone="danger">{orders.error.message}</Notice>}
      <DataTable label="Purchase orders" data={orders.data ?? []} columns={columns} getRowId={(o) => o.id} dense empty={orders.isLoading ? 'Loading…' : 'No purchase orders yet.'} />
    </Page>
  );
}
