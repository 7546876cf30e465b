import { Link, useNavigate, useSearchParams } from 'react-router';
import { Page } from '@/components/ui/page.tsx';
import { Notice } from '@/components/ui/notice.tsx';
import { Button } from '@/components/ui/button.tsx';
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
  const navigate = useNavigate();
  const [params, setParams] = useSearchParams();
  const sku = params.get('sku') ?? '';
  const warehouse = params.get('warehouse') ?? '';
  const page = Number(params.get('page') ?? 1) || 1;
  const stock = useStock({ sku: sku || undefined, warehouse: warehouse || undefined, page, pageSize: PAGE_SIZE });
  const { data: warehouses = [] } = useWarehouses();
  const set = (key: string, value: string) => {
    const next = new URLSearchParams(params);
    if (value) next.set(key, value);
    else next.delete(key);
    if (key !== 'page') next.delete('page');
    setParams(next, { replace: true });
  };
  const total = stock.data?.total ?? 0;
  const pages = Math.max(1, Math.ceil(total / PAGE_SIZE));
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
      {stock.isLoading ? <p className="text-sm text-ink-soft">Loading stock…</p> : <LevelsTable levels={stock.data?.data ?? []} onOpen={(l) => navigate(paths.stockMovements.href(new URLSearchParams({ sku: l.sku }).toString()))} />}
      <nav aria-label="Pages" className="mt-2 flex items-center justify-between text-sm text-ink-soft">
        <span>{total} rows</span>
        <span className="flex items-center gap-2">
          <Button variant="ghost" disabled={page <= 1} onClick={() => set('page', String(page - 1))}>
            ← Previous
          </Button>
          <span className="num">
            {page} / {pages}
          </span>
          <Button variant="ghost" disabled={page >= pages} onClick={() => set('page', String(page + 1))}>
            Next →
          </Button>
        </span>
      </nav>
    </Page>
  );
}
