import { useMemo } from 'react';
import { Link, useSearchParams } from 'react-router';
import type { ColumnDef } from '@tanstack/react-table';
import { MOVEMENT_KINDS, MOVEMENT_KIND_LABELS, type Movement, type MovementKind } from '@shared/contracts/stock.ts';
import { Page } from '@/components/ui/page.tsx';
import { Notice } from '@/components/ui/notice.tsx';
import { Button } from '@/components/ui/button.tsx';
import { DataTable } from '@/components/ui/data-table.tsx';
import { SelectField, TextField, optionsOf } from '@/components/ui/field.tsx';
import { paths } from '@/config/paths.ts';
import { useMovements } from '@/features/stock/api/get-movements.ts';
import { useWarehouses } from '@/features/stock/api/get-warehouses.ts';

const PAGE_SIZE = 50;

/** The stock ledger, newest first: every unit that came, went or moved, by whom and why. */
export function StockMovementsRoute() {
  const [params, setParams] = useSearchParams();
  const q = {
    sku: params.get('sku') || undefined,
    warehouse: params.get('warehouse') || undefined,
    kind: (params.get('kind') || undefined) as MovementKind | undefined,
    from: params.get('from') || undefined,
    to: params.get('to') || undefined,
  };
  const page = Number(params.get('page') ?? 1) || 1;
  const moves = useMovements({ ...q, page, pageSize: PAGE_SIZE });
  const { data: warehouses = [] } = useWarehouses();
  const set = (key: string, value: string) => {
    const next = new URLSearchParams(params);
    if (value) next.set(key, value);
    else next.delete(key);
    if (key !== 'page') next.delete('page');
    setParams(next, { replace: true });
  };
  const columns = useMemo<ColumnDef<Movement>[]>(
    () => [
      { id: 'at', accessorKey: 'at', header: 'When', cell: (c) => <span className="num whitespace-nowrap">{c.row.original.at.slice(0, 16).replace('T', ' ')}</span> },
      { id: 'sku', accessorKey: 'sku', header: 'SKU', cell: (c) => <span className="num font-semibold">{c.row.original.sku}</span> },
      { id: 'where', header: 'Where', accessorFn: (m) => `${m.warehouse} ${m.bin}`, cell: (c) => <span className="num whitespace-nowrap">{c.getValue<string>()}</span> },
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
      { id: 'reason', accessorKey: 'reason', header: 'Reason', cell: (c) => c.row.original.reason ?? <span className="text-ink-soft">—</span> },
      { id: 'by', accessorKey: 'by', header: 'By', cell: (c) => c.row.original.by ?? 'Stackyard' },
    ],
    [],
  );
  const total = moves.data?.total ?? 0;
  const pages = Math.max(1, Math.ceil(total / PAGE_SIZE));
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
      <nav aria-label="Pages" className="mt-2 flex items-center justify-between text-sm text-ink-soft">
        <span>{total} movements</span>
        <span className="flex items-center gap-2">
          <Button variant="ghost" disabled={page <= 1} onClick={() => set('page', String(page - 1))}>
            ← Newer
          </Button>
          <span className="num">
            {page} / {pages}
          </span>
          <Button variant="ghost" disabled={page >= pages} onClick={() => set('page', String(page + 1))}>
            Older →
          </Button>
        </span>
      </nav>
    </Page>
  );
}
