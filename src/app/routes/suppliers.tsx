import { useMemo } from 'react';
import { Link } from 'react-router';
import type { ColumnDef } from '@tanstack/react-table';
import type { Supplier } from '@shared/contracts/purchasing.ts';
import { Page } from '@/components/ui/page.tsx';
import { Notice } from '@/components/ui/notice.tsx';
import { DataTable, PHONE_HIDDEN, ROW_ACTION } from '@/components/ui/data-table.tsx';
import { paths } from '@/config/paths.ts';
import { formatDate } from '@/lib/format.ts';
import { PurchasingTabs } from '@/features/purchasing/components/purchasing-tabs.tsx';
import { useSuppliers } from '@/features/purchasing/api/suppliers.ts';

/** Suppliers with their terms: currency, how they write numbers, lead time. */
export function SuppliersRoute() {
  const suppliers = useSuppliers();
  const columns = useMemo<ColumnDef<Supplier>[]>(
    () => [
      { id: 'name', accessorKey: 'name', header: 'Supplier', cell: (c) => (
        <>
          <Link {...ROW_ACTION} to={paths.supplier.href(c.row.original.id)} className="font-semibold text-copper-dark underline-offset-2 hover:underline">{c.row.original.name}</Link>
          <span className="block text-xs text-ink-soft">{c.row.original.code} · {c.row.original.currency}</span>
        </>
      ) },
      { id: 'parts', accessorKey: 'parts', header: 'Parts', meta: { align: 'right' }, cell: (c) => <span className="num">{c.row.original.parts}</span> },
      { id: 'lead', accessorKey: 'leadTimeDays', header: 'Lead time', meta: { align: 'right', className: PHONE_HIDDEN }, cell: (c) => <span className="num">{c.row.original.leadTimeDays} days</span> },
      { id: 'locale', accessorKey: 'numberLocale', header: 'Numbers', meta: { className: PHONE_HIDDEN }, cell: (c) => <span className="num">{c.row.original.numberLocale}</span> },
      { id: 'contact', header: 'Contact', meta: { className: PHONE_HIDDEN }, cell: (c) => c.row.original.contactEmail ?? '—' },
      { id: 'last', header: 'Last price list', meta: { className: PHONE_HIDDEN }, cell: (c) => (c.row.original.lastImportAt ? formatDate(c.row.original.lastImportAt) : '—') },
    ],
    [],
  );
  return (
    <Page title="Suppliers" subtitle="Who we buy from, on what terms, and what each sells us.">
      <PurchasingTabs />
      {suppliers.error && <Notice tone="danger">{suppliers.error.message}</Notice>}
      <DataTable label="Suppliers" data={suppliers.data ?? []} columns={columns} getRowId={(s) => s.id} dense empty={suppliers.isLoading ? 'Loading…' : 'No suppliers yet.'} />
    </Page>
  );
}
