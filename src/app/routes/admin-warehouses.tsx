import { useState } from 'react';
import { Page, Card } from '@/components/ui/page.tsx';
import { Notice } from '@/components/ui/notice.tsx';
import { Button } from '@/components/ui/button.tsx';
import { useWarehouses } from '@/features/stock/api/get-warehouses.ts';
import { hasAbility, useMe } from '@/features/auth/api/get-me.ts';
import { BinForm, WarehouseForm } from '@/features/stock/components/warehouse-forms.tsx';

/** Warehouses (rank decides where reservations look first) and their bins in pick order. */
export function AdminWarehousesRoute() {
  const warehouses = useWarehouses();
  const { data: me } = useMe();
  const manages = hasAbility(me, 'warehouses.manage');
  const [open, setOpen] = useState<string | null>(null);
  return (
    <Page title="Warehouses and bins" subtitle="Reservations try warehouses by rank (after a job’s preferred one); pickers walk bins in pick order.">
      <div className="space-y-4">
        {manages ? (
          <Card>
            <WarehouseForm />
          </Card>
        ) : (
          <Notice>Only an administrator changes warehouses and bins.</Notice>
        )}
        {warehouses.error && <Notice tone="danger">{warehouses.error.message}</Notice>}
        {(warehouses.data ?? []).map((w) => (
          <Card key={w.id}>
            <div className="flex flex-wrap items-start justify-between gap-2">
              <h2 className="text-base font-semibold">
                <span className="num">{w.code}</span> · {w.name} <span className="text-sm font-normal text-ink-soft">rank {w.rank}</span>
              </h2>
              {manages ? (
                <Button variant="ghost" onClick={() => setOpen(open === w.id ? null : w.id)} aria-expanded={open === w.id}>
                  {open === w.id ? 'Close' : `Edit (${w.bins.length} bins)`}
                </Button>
              ) : (
                <span className="text-sm text-ink-soft">{w.bins.length} bins</span>
              )}
            </div>
            {open === w.id && (
              <div className="mt-3 space-y-3">
                <WarehouseForm warehouse={w} />
                <BinForm warehouseId={w.id} />
                <ul className="max-h-96 space-y-1 overflow-auto border-t border-line pt-2">
                  {w.bins.map((b) => (
                    <li key={b.id} className="flex flex-wrap items-end gap-3">
                      <BinForm warehouseId={w.id} bin={b} />
                      <span className="pb-2 text-xs text-ink-soft">{b.parts} parts in stock</span>
                    </li>
                  ))}
                </ul>
              </div>
            )}
          </Card>
        ))}
      </div>
    </Page>
  );
}
