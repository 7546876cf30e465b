import { useEffect, useMemo, useState } from 'react';
import { Link } from 'react-router';
import type { ColumnDef } from '@tanstack/react-table';
import type { Suggestion } from '@shared/contracts/purchasing.ts';
import { Page } from '@/components/ui/page.tsx';
import { Notice } from '@/components/ui/notice.tsx';
import { Button } from '@/components/ui/button.tsx';
import { DataTable, PHONE_HIDDEN } from '@/components/ui/data-table.tsx';
import { paths } from '@/config/paths.ts';
import { formatCost } from '@/lib/format.ts';
import { PurchasingTabs } from '@/features/purchasing/components/purchasing-tabs.tsx';
import { useDraftOrders, useSuggestions } from '@/features/purchasing/api/orders.ts';

/** Reorder suggestions: what to buy, how many (MOQ and packs) and from whom; chosen lines become draft orders. */
export function ReorderRoute() {
  const suggestions = useSuggestions();
  const draft = useDraftOrders();
  const orderable = useMemo(() => (suggestions.data ?? []).filter((s) => s.supplier && s.orderQty > 0), [suggestions.data]);
  const [chosen, setChosen] = useState<Set<string>>(new Set());
  useEffect(() => setChosen(new Set(orderable.map((s) => s.sku))), [orderable]);
  const toggle = (sku: string) => setChosen((c) => {
    const n = new Set(c);
    if (n.has(sku)) n.delete(sku);
    else n.add(sku);
    return n;
  });
  const columns = useMemo<ColumnDef<Suggestion>[]>(
    () => [
      { id: 'pick', header: 'Order', cell: (c) => (c.row.original.supplier ? <input type="checkbox" aria-label={`Order ${c.row.original.sku}`} checked={chosen.has(c.row.original.sku)} onChange={() => toggle(c.row.original.sku)} className="h-4 w-4" /> : null) },
      { id: 'sku', accessorKey: 'sku', header: 'Part', cell: (c) => (
        <>
          <span className="num font-semibold">{c.row.original.sku}</span>
          <span className="block text-xs text-ink-soft">{c.row.original.name}</span>
          <span className="block text-xs text-ink-soft max-sm:hidden">{c.row.original.why}</span>
        </>
      ) },
      { id: 'position', header: 'Avail. / min / max', meta: { align: 'right', className: PHONE_HIDDEN }, cell: (c) => <span className="num">{c.row.original.available - c.row.original.backordered + c.row.original.onOrder} / {c.row.original.min} / {c.row.original.max}</span> },
      { id: 'qty', header: 'Order qty', meta: { align: 'right' }, cell: (c) => <span className="num font-semibold">{c.row.original.orderQty}</span> },
      { id: 'supplier', header: 'Supplier', cell: (c) => (c.row.original.supplier ? (
        <>
          <span>{c.row.original.supplier.name}</span>
          <span className="block text-xs text-ink-soft"><span className="num">{formatCost(c.row.original.supplier.unitCostCents)}</span> each · {c.row.original.supplier.leadTimeDays} days</span>
        </>
      ) : <span className="text-sm text-danger">No supplier cost</span>) },
    ],
    [chosen],
  );
  const lines = orderable.filter((s) => chosen.has(s.sku)).map((s) => ({ sku: s.sku, qty: s.orderQty }));
  return (
    <Page title="Reorder" subtitle="Available − backorders + on order (drafts included) at or below the minimum; quantities up to the maximum, rounded to each supplier’s MOQ and packs.">
      <PurchasingTabs />
      {suggestions.error && <Notice tone="danger">{suggestions.error.message}</Notice>}
      <div className="mb-3 flex flex-wrap items-center gap-3">
        <Button variant="primary" disabled={lines.length === 0 || draft.isPending} onClick={() => draft.mutate(lines)}>Draft purchase orders ({lines.length} lines)</Button>
        {draft.data && (
          <Notice tone="good" title="Drafted">
            {draft.data.map((po, i) => (
              <span key={po.id}>{i > 0 && ', '}<Link to={paths.purchaseOrder.href(po.id)} className="num font-semibold underline">{po.number}</Link></span>
            ))}
          </Notice>
        )}
        {draft.error && <Notice tone="danger">{draft.error.message}</Notice>}
      </div>
      <DataTable label="Reorder suggestions" data={suggestions.data ?? []} columns={columns} getRowId={(s) => s.sku} dense empty={suggestions.isLoading ? 'Loading…' : 'Nothing needs ordering.'} />
    </Page>
  );
}
