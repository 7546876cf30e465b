import { useMemo } from 'react';
import { Link } from 'react-router';
import type { ColumnDef } from '@tanstack/react-table';
import { MOVEMENT_KINDS, MOVEMENT_KIND_LABELS, type Movement, type MovementKind } from '@shared/contracts/stock.ts';
import { Page } from '@/components/ui/page.tsx';
import { Notice } from '@/components/ui/notice.tsx';
import { Pager } from '@/components/ui/pager.tsx';
import { useUrlFilters } from '@/lib/use-url-filters.ts';
import { formatDateTime } from '@/lib/format.ts';
import { DataTable, PHONE_HIDDEN } from '@/components/ui/data-table.tsx';
import { SelectField, TextField, optionsOf } from '@/components/ui/field.tsx';
import { paths } from '@/config/paths.ts';
import { useMovements } from '@/features/stock/api/get-movements.ts';
import { useWarehouses } from '@/features/stock/api/get-warehouses.ts';

const PAGE_SIZE = 50;

/** The stock ledger, newest first: every unit that came, went or moved, by whom and why. */
export function StockMovementsRoute() {
  const { get, set, page, setPage } = useUrlFilters();
  const q = { sku: get('sku'), warehouse: get('warehouse'), kind: get('kind') as MovementKind | undefined, from: get('from'), to: get('to') };
  const moves = useMovements({ ...q, page, pageSize: PAGE_SIZE });
  const { data: warehouses = [] } = useWarehouses();
  const columns = useMemo<ColumnDef<Movement>[]>(
    () => [
      { id: 'at', accessorKey: 'at', header: 'When', meta: { className: PHONE_HIDDEN }, cell: (c) => <span className="num whitespace-nowrap">{formatDateTime(c.row.original.at)}</span> },
      { id: 'sku', accessorKey: 'sku', header: 'SKU',
        cell: (c) => (
          <>
            <span className="num font-semibold">{c.row.original.sku}</span>
            <span className="num block text-xs text-ink-soft sm:hidden">
              {c.row.original.warehouse} {c.row.original.bin} · {formatDateTime(c.row.original.at)}
            </span>
          </>
        ),
      },
      { id: 'where', header: 'Where', meta: { className: PHONE_HIDDEN }, accessorFn: (m) => `${m.warehouse} ${m.bin}`, cell: (c) => <span className="num whitespace-nowrap">{c.getValue<string>()}</span> },
      { id: 'kind', accessorKey: 'kind', header: 'Movement', cell: (c) => MOVEMENT_KIND_LABELS[c.row.original.kind] },
      {
        id: 'qty',
        accessorKey: 'qty',
        header: 'Qty',
        meta: { align: 'right' },
        cell: (c) => <span className={`num font-semibold ${c.row.original.qty < 0 ? 'text-danger' : 'text-teal'}`}>{c.row.original.qty > 0 ? `+${c.row.original.qty}` : `−${-c.row.original.qty}`}</span>,
      },
      {
        id: 'ref',
        header: 'Reference',
        meta: { className: PHONE_HIDDEN },
        accessorFn: (m) => m.job?.reference ?? m.reference ?? '',
        cell: (c) =>
          c.row.original.job ? (
            <Link to={paths.job.href(c.row.original.job.id)} className="underline hover:text-copper">
              {c.row.original.job.reference}
            </Link>
          ) : (
            <span className="num">{c.row.original.reference ?? '—'}</span>
          ),
      },
      { id: 'reason', accessorKey: 'reason', header: 'Reason', meta: { className: PHONE_HIDDEN }, cell: (c) => c.row.original.reason ?? <span className="text-ink-soft">—</span> },
      { id: 'by', accessorKey: 'by', header: 'By', meta: { className: PHONE_HIDDEN }, cell: (c) => c.row.original.by ?? 'Stackyard' },
    ],
    [],
  );
  const total = moves.data?.total ?? 0;
  return (
    <Page title="Stock movements" subtitle="The ledger: levels are always the sum of these.">
      <form role="search" aria-label="Filter movements" className="mb-3 grid gap-2 sm:grid-cols-3 lg:grid-cols-5" onSubmit={(e) => e.preventDefault()}>
        <TextField label="SKU" type="search" mono defaultValue={q.sku ?? ''} onChange={(e) => set('sku', e.target.value.trim())} />
        <SelectField label="Warehouse" value={q.warehouse ?? ''} onChange={(e) => set('warehouse', e.target.value)} options={warehouses.map((w) => ({ value: w.code, label: w.code }))}>
          <option value="">All</option>
        </SelectField>
        <SelectField label="Movement" value={q.kind ?? ''} onChange={(e) => set('kind', e.target.value)} options={optionsOf(MOVEMENT_KINDS, MOVEMENT_KIND_LABELS)}>
          <option value="">Any</option>
        </SelectField>
        <TextField label="From" type="date" value={q.from ?? ''} onChange={(e) => set('from', e.target.value)} />
        <TextField label="To" type="date" value={q.to ?? ''} onChange={(e) => set('to', e.target.value)} />
      </form>
      {moves.error && <Notice tone="danger">{moves.error.message}</Notice>}
      <DataTable label="Stock movements" data={moves.data?.data ?? []} columns={columns} getRowId={(m) => String(m.id)} dense empty={moves.isLoading ? 'Loading…' : 'No movements match.'} />
      <Pager page={page} pageSize={PAGE_SIZE} total={total} noun="movements" onPage={setPage} labels={['← Newer', 'Older →']} />
    </Page>
  );
}
