import { useState, type FormEvent } from 'react';
import { useParams } from 'react-router';
import { PO_STATUS_LABELS, type PurchaseOrder } from '@shared/contracts/purchasing.ts';
import { Page, Card } from '@/components/ui/page.tsx';
import { Notice, StatusTag } from '@/components/ui/notice.tsx';
import { Button } from '@/components/ui/button.tsx';
import { MoneyTotals } from '@/components/ui/money-totals.tsx';
import { download } from '@/lib/api-client.ts';
import { formatCost, formatDate, formatMoney } from '@/lib/format.ts';
import { hasAbility, useMe } from '@/features/auth/api/get-me.ts';
import { PurchasingTabs } from '@/features/purchasing/components/purchasing-tabs.tsx';
import { useOrder, useOrderAction, useReceiveOrder } from '@/features/purchasing/api/orders.ts';

/** One purchase order: its lines, send / close / PDF for purchasing, and receiving for the warehouse. */
export function PurchaseOrderRoute() {
  const { id = '' } = useParams();
  const { data: me } = useMe();
  const order = useOrder(id);
  const action = useOrderAction();
  const receive = useReceiveOrder();
  const po = order.data;
  const buyer = hasAbility(me, 'purchasing.manage');
  const receiver = hasAbility(me, 'stock.receive');
  return (
    <Page
      title={po ? `Purchase order ${po.number}` : 'Purchase order'}
      subtitle={po ? `${po.supplier.name} · to ${po.warehouse} · made ${formatDate(po.createdAt)}${po.sentAt ? ` · sent ${formatDate(po.sentAt)}` : ''}` : undefined}
      actions={po && (
        <>
          <StatusTag tone={po.status === 'received' || po.status === 'closed' ? 'good' : 'info'}>{PO_STATUS_LABELS[po.status]}</StatusTag>
          {buyer && <Button onClick={() => void download(`/purchase-orders/${encodeURIComponent(po.id)}/pdf`)}>PDF for the supplier</Button>}
          {buyer && po.status === 'draft' && <Button variant="primary" disabled={action.isPending} onClick={() => action.mutate({ id: po.id, action: 'send' })}>Mark as sent</Button>}
          {buyer && ['sent', 'part-received', 'received'].includes(po.status) && <Button disabled={action.isPending} onClick={() => action.mutate({ id: po.id, action: 'close' })}>Close</Button>}
        </>
      )}
    >
      {buyer && <PurchasingTabs />}
      {order.error && <Notice tone="danger">{order.error.message}</Notice>}
      {action.error && <Notice tone="danger">{action.error.message}</Notice>}
      {po && (
        <div className="space-y-4">
          {po.status === 'draft' && buyer && <Notice tone="info">E-mailing orders to suppliers comes with the mail queue; until then send the PDF yourself, then mark the order as sent.</Notice>}
          <Card>
            <ul className="divide-y divide-line">
              {po.lines.map((l) => (
                <li key={l.id} className="flex flex-wrap items-baseline justify-between gap-2 py-2 text-sm">
                  <span>
                    <span className="num font-semibold">{l.sku}</span> <span className="text-ink-soft">· supplier’s <span className="num">{l.supplierSku}</span></span>
                    <span className="block text-xs text-ink-soft">{l.name}</span>
                  </span>
                  <span className="num text-right">
                    {l.received} of {l.qty} received
                    {l.unitCostCents !== null && <span className="block text-xs text-ink-soft">{formatCost(l.unitCostCents)} each · {formatMoney(l.lineCents ?? 0)}</span>}
                  </span>
                </li>
              ))}
            </ul>
          </Card>
          {po.totals && <MoneyTotals totals={{ subtotalCents: po.totals.exCents, gstCents: po.totals.gstCents, totalCents: po.totals.incCents, unpricedLines: 0 }} basis="Costs ex GST; GST on the order total" />}
          {receive.data && (
            <Notice tone="good" title={`Booked in as ${receive.data.reference}`}>
              {receive.data.filledJobs.length ? `Backorders filled: ${receive.data.filledJobs.map((j) => `${j.reference} (${j.units})`).join(', ')}.` : 'No backorders were waiting for these parts.'}
            </Notice>
          )}
          {receiver && ['sent', 'part-received'].includes(po.status) && <ReceiveForm po={po} receive={receive} />}
        </div>
      )}
    </Page>
  );
}

function ReceiveForm({ po, receive }: { po: PurchaseOrder; receive: ReturnType<typeof useReceiveOrder> }) {
  const open = po.lines.filter((l) => l.received < l.qty);
  const [qty, setQty] = useState<Record<string, string>>(() => Object.fromEntries(open.map((l) => [l.id, String(l.qty - l.received)])));
  const [reference, setReference] = useState('');
  const [bins, setBins] = useState<Record<string, string>>({});
  const [fallbackBin, setFallbackBin] = useState('');
  const [serials, setSerials] = useState<Record<string, string>>({});
  /** A scanner ends each serial with Enter: one per line. */
  const serialsOf = (id: string) => (serials[id] ?? '').split(/\s+/).filter(Boolean);
  const submit = (e: FormEvent) => {
    e.preventDefault();
    const lines = open
      .map((l) => ({ lineId: l.id, qty: Number(qty[l.id] ?? 0), ...(bins[l.id]?.trim() ? { bin: bins[l.id]!.trim() } : {}), ...(l.serialised ? { serials: serialsOf(l.id) } : {}) }))
      .filter((l) => Number.isInteger(l.qty) && l.qty > 0);
    if (lines.length) receive.mutate({ id: po.id, input: { lines, ...(reference.trim() ? { reference: reference.trim() } : {}), ...(fallbackBin.trim() ? { fallbackBin: fallbackBin.trim() } : {}) } });
  };
  return (
    <Card>
      <h2 className="mb-2 text-sm font-semibold">Receive goods against this order</h2>
      <form onSubmit={submit} className="space-y-2">
        {open.map((l) => (
          <div key={l.id} className="flex flex-wrap items-center justify-between gap-2 text-sm">
            <label htmlFor={`rcv-${l.id}`} className="min-w-0 flex-1"><span className="num font-semibold">{l.sku}</span> <span className="text-ink-soft">({l.qty - l.received} expected)</span></label>
            <input id={`rcv-${l.id}`} inputMode="numeric" value={qty[l.id] ?? ''} onChange={(e) => setQty((q) => ({ ...q, [l.id]: e.target.value }))} className="num w-20 rounded border border-line bg-card px-2 py-1 text-right" />
            <input aria-label={`Bin for ${l.sku}`} placeholder="usual bin" value={bins[l.id] ?? ''} onChange={(e) => setBins((b) => ({ ...b, [l.id]: e.target.value }))} className="num w-24 rounded border border-line bg-card px-2 py-1" />
            {l.serialised && (
              <label className="block w-full text-xs text-ink-soft">
                Serials of {l.sku}, one per line ({serialsOf(l.id).length} of {qty[l.id] || 0})
                <textarea rows={2} value={serials[l.id] ?? ''} onChange={(e) => setSerials((s) => ({ ...s, [l.id]: e.target.value }))} className="num mt-1 block w-full rounded border border-line bg-card px-2 py-1 text-sm text-ink" />
              </label>
            )}
          </div>
        ))}
        <div className="flex flex-wrap items-end gap-3">
          <div>
            <label htmlFor="rcv-ref" className="mb-1 block text-xs font-semibold text-ink-soft">Delivery docket (optional)</label>
            <input id="rcv-ref" value={reference} onChange={(e) => setReference(e.target.value)} className="num rounded border border-line bg-card px-2 py-1" />
          </div>
          <div>
            <label htmlFor="rcv-fallback" className="mb-1 block text-xs font-semibold text-ink-soft">Receiving bin (parts with no bin here yet)</label>
            <input id="rcv-fallback" value={fallbackBin} onChange={(e) => setFallbackBin(e.target.value)} className="num rounded border border-line bg-card px-2 py-1" />
          </div>
          <Button type="submit" variant="primary" disabled={receive.isPending}>Book in</Button>
        </div>
      </form>
      {receive.error && <div className="mt-3"><Notice tone="danger">{receive.error.message}</Notice></div>}
    </Card>
  );
}
