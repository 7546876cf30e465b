import { Link } from 'react-router';
import { Page } from '@/components/ui/page.tsx';
import { Notice } from '@/components/ui/notice.tsx';
import { Pager } from '@/components/ui/pager.tsx';
import { useUrlFilters } from '@/lib/use-url-filters.ts';
import { SelectField, TextField } from '@/components/ui/field.tsx';
import { paths } from '@/config/paths.ts';
import { hasAbility, useMe } from '@/features/auth/api/get-me.ts';
import { useStock } from '@/features/stock/api/get-stock.ts';
import { useWarehouses } from '@/features/stock/api/get-warehouses.ts';
import { LevelsTable } from '@/features/stock/components/levels-table.tsx';

const PAGE_SIZE = 100;
const linkClass = 'inline-flex items-center rounded-md border border-line bg-card px-3 py-1.5 text-sm font-medium hover:border-ink-soft';

export function StockRoute() {
  const { data: me } = useMe();
  const { get, set, page, setPage } = useUrlFilters();
  const sku = get('sku') ?? '';
  const warehouse = get('warehouse') ?? '';
  const stock = useStock({ sku: sku || undefined, warehouse: warehouse || undefined, page, pageSize: PAGE_SIZE });
  const { data: warehouses = [] } = useWarehouses();
  const total = stock.data?.total ?? 0;
  return (
    <Page
      title="Stock"
      subtitle="On hand, reserved and available per part, warehouse and bin. Every change is in the movement history."
      actions={
        <span className="flex flex-wrap gap-2">
          <Link to={paths.stockLow.href()} className={linkClass}>
            Low stock
          </Link>
          <Link to={paths.stockMovements.href()} className={linkClass}>
            Movements
          </Link>
          {(hasAbility(me, 'stock.adjust') || hasAbility(me, 'stock.receive')) && (
            <Link to={paths.stockEntry.href()} className="inline-flex items-center rounded-md border border-copper bg-copper px-3 py-1.5 text-sm font-medium text-white hover:bg-copper-dark">
              Receive / adjust / transfer
            </Link>
          )}
        </span>
      }
    >
      <form role="search" aria-label="Filter stock" className="mb-3 grid gap-2 sm:grid-cols-3" onSubmit={(e) => e.preventDefault()}>
        <TextField label="SKU starts with" type="search" mono defaultValue={sku} onChange={(e) => set('sku', e.target.value.trim())} />
        <SelectField label="Warehouse" value={warehouse} onChange={(e) => set('warehouse', e.target.value)} options={warehouses.map((w) => ({ value: w.code, label: `${w.name} (${w.code})` }))}>
          <option value="">All warehouses</option>
        </SelectField>
      </form>
      {stock.error && <Notice tone="danger">{stock.error.message}</Notice>}
      {stock.isLoading ? <p className="text-sm text-ink-soft">Loading stock…</p> : <LevelsTable levels={stock.data?.data ?? []} />}
      <Pager page={page} pageSize={PAGE_SIZE} total={total} noun="rows" onPage={setPage} />
    </Page>
  );
}
