import { useMemo, useState, type FormEvent } from 'react';
import { Link, useNavigate } from 'react-router';
import type { ColumnDef } from '@tanstack/react-table';
import { IMPORT_STATUS_LABELS } from '@shared/contracts/purchasing.ts';
import { Page, Card } from '@/components/ui/page.tsx';
import { Notice, StatusTag } from '@/components/ui/notice.tsx';
import { Button } from '@/components/ui/button.tsx';
import { SelectField } from '@/components/ui/field.tsx';
import { DataTable, PHONE_HIDDEN, ROW_ACTION } from '@/components/ui/data-table.tsx';
import { paths } from '@/config/paths.ts';
import { formatDate, formatNumber } from '@/lib/format.ts';
import { PurchasingTabs } from '@/features/purchasing/components/purchasing-tabs.tsx';
import { useSuppliers } from '@/features/purchasing/api/suppliers.ts';
import { usePriceLists, useUploadPriceList, type PriceListSummary } from '@/features/purchasing/api/price-lists.ts';

/** Price-list imports: upload a supplier's file, and the history of every import. */
export function PriceListsRoute() {
  const lists = usePriceLists();
  const columns = useMemo<ColumnDef<PriceListSummary>[]>(
    () => [
      { id: 'file', accessorKey: 'fileName', header: 'File', cell: (c) => (
        <>
          <Link {...ROW_ACTION} to={paths.priceList.href(c.row.original.id)} className="font-semibold text-copper-dark underline-offset-2 hover:underline break-all">{c.row.original.fileName}</Link>
          <span className="block text-xs text-ink-soft sm:hidden">{c.row.original.supplier} · {formatDate(c.row.original.createdAt)}</span>
        </>
      ) },
      { id: 'supplier', accessorKey: 'supplier', header: 'Supplier', meta: { className: PHONE_HIDDEN } },
      { id: 'status', accessorKey: 'status', header: 'Status', cell: (c) => <StatusTag tone={c.row.original.status === 'applied' ? 'good' : c.row.original.status === 'failed' ? 'danger' : 'info'}>{IMPORT_STATUS_LABELS[c.row.original.status]}</StatusTag> },
      { id: 'rows', header: 'Rows', meta: { align: 'right', className: PHONE_HIDDEN }, cell: (c) => <span className="num">{formatNumber(c.row.original.counts.rows ?? 0)}</span> },
      { id: 'changed', header: 'Changed', meta: { align: 'right', className: PHONE_HIDDEN }, cell: (c) => <span className="num">{c.row.original.counts.changed ?? '—'}</span> },
      { id: 'created', accessorKey: 'createdAt', header: 'Uploaded', meta: { className: PHONE_HIDDEN }, cell: (c) => `${formatDate(c.row.original.createdAt)}${c.row.original.createdBy ? ` · ${c.row.original.createdBy}` : ''}` },
      { id: 'applied', accessorKey: 'appliedAt', header: 'Applied', meta: { className: PHONE_HIDDEN }, cell: (c) => (c.row.original.appliedAt ? formatDate(c.row.original.appliedAt) : '—') },
    ],
    [],
  );
  return (
    <Page title="Purchasing" subtitle="Bring in supplier price lists: check every row and the changes before anything changes.">
      <PurchasingTabs />
      <UploadForm />
      <h2 className="mb-2 mt-6 text-sm font-semibold">Import history</h2>
      {lists.error && <Notice tone="danger">{lists.error.message}</Notice>}
      <DataTable label="Price-list imports" data={lists.data ?? []} columns={columns} getRowId={(l) => l.id} dense empty={lists.isLoading ? 'Loading…' : 'No price lists imported yet.'} />
    </Page>
  );
}

function UploadForm() {
  const suppliers = useSuppliers();
  const upload = useUploadPriceList();
  const navigate = useNavigate();
  const [supplierId, setSupplierId] = useState('');
  const [file, setFile] = useState<File | null>(null);
  const submit = (e: FormEvent) => {
    e.preventDefault();
    if (!supplierId || !file) return;
    upload.mutate({ supplierId, file }, { onSuccess: (pl) => navigate(paths.priceList.href(pl.id)) });
  };
  return (
    <Card>
      <h2 className="mb-3 text-sm font-semibold">New price list</h2>
      <form onSubmit={submit} className="grid gap-3 sm:grid-cols-[1fr_1fr_auto] sm:items-end">
        <SelectField label="Supplier" value={supplierId} onChange={(e) => setSupplierId(e.target.value)} required options={(suppliers.data ?? []).map((s) => ({ value: s.id, label: `${s.name} (${s.currency}, ${s.numberLocale})` }))}>
          <option value="">Choose…</option>
        </SelectField>
        <div>
          <label htmlFor="price-file" className="mb-1 block text-xs font-semibold text-ink-soft">File (CSV or XLSX, up to 20 MB)</label>
          <input id="price-file" type="file" accept=".csv,.txt,.xlsx,text/csv,application/vnd.openxmlformats-officedocument.spreadsheetml.sheet" required onChange={(e) => setFile(e.target.files?.[0] ?? null)} className="block w-full text-sm file:mr-3 file:rounded-md file:border file:border-line file:bg-card file:px-3 file:py-1.5" />
        </div>
        <Button type="submit" variant="primary" disabled={upload.isPending || !supplierId || !file}>{upload.isPending ? 'Reading…' : 'Upload and read'}</Button>
      </form>
      {upload.error && <div className="mt-3"><Notice tone="danger" title="The file was not taken">{upload.error.message}</Notice></div>}
      <p className="mt-3 text-xs text-ink-soft">Sample files for the two demo suppliers are in the project’s <span className="num">seed/price-lists/</span> folder.</p>
    </Card>
  );
}
