import { useSearchParams } from 'react-router';
import { Page } from '@/components/ui/page.tsx';
import { hasAbility, useMe } from '@/features/auth/api/get-me.ts';
import { useWarehouses } from '@/features/stock/api/get-warehouses.ts';
import { AdjustmentForm, ReceiptForm, TransferForm } from '@/features/stock/components/ledger-forms.tsx';
import { BinCountForm } from '@/features/stock/components/bin-count.tsx';

const TABS = [
  { id: 'receive', label: 'Receive goods', needs: 'stock.receive' },
  { id: 'adjust', label: 'Adjust', needs: 'stock.adjust' },
  { id: 'transfer', label: 'Transfer', needs: 'stock.transfer' },
  { id: 'count', label: 'Count a bin', needs: 'stock.adjust' },
] as const;

/** Goods in, adjustments and transfers: each one a movement in the ledger. */
export function StockEntryRoute() {
  const { data: me } = useMe();
  const [params, setParams] = useSearchParams();
  const { data: warehouses = [] } = useWarehouses();
  const tabs = TABS.filter((t) => hasAbility(me, t.needs));
  const current = tabs.find((t) => t.id === params.get('tab')) ?? tabs[0];
  return (
    <Page title="Stock in and out" subtitle="Every entry is an immutable movement; receipts fill waiting backorders oldest first.">
      {tabs.length === 0 ? (
        <p className="text-sm text-ink-soft">Your role does not change stock.</p>
      ) : (
        <>
          <div role="tablist" aria-label="Kind of entry" className="mb-4 flex flex-wrap gap-1 border-b border-line">
            {tabs.map((t) => (
              <button key={t.id} role="tab" type="button" aria-selected={t.id === current?.id} onClick={() => setParams({ tab: t.id }, { replace: true })} className={`-mb-px border-b-2 px-3 py-1.5 text-sm font-medium ${t.id === current?.id ? 'border-copper text-ink' : 'border-transparent text-ink-soft hover:text-ink'}`}>
                {t.label}
              </button>
            ))}
          </div>
          <div role="tabpanel">
            {current?.id === 'receive' && <ReceiptForm warehouses={warehouses} />}
            {current?.id === 'adjust' && <AdjustmentForm warehouses={warehouses} />}
            {current?.id === 'transfer' && <TransferForm warehouses={warehouses} />}
            {current?.id === 'count' && <BinCountForm warehouses={warehouses} />}
          </div>
        </>
      )}
    </Page>
  );
}
