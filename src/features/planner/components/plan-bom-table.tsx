import { useMemo } from 'react';
import type { ColumnDef } from '@tanstack/react-table';
import { CATEGORY_LABELS, type CategoryCode } from '@shared/contracts/part-attributes.ts';
import { DataTable, PHONE_HIDDEN, type ColumnMeta } from '@/components/ui/data-table.tsx';
import { StatusTag } from '@/components/ui/notice.tsx';
import { formatMoney, formatNumber } from '@/lib/format.ts';
import { MoneyTotals } from '@/components/ui/money-totals.tsx';
import { warehousesOf, type ShownLine, type ShownPlan } from '../lib/plan-view.ts';
import { SkuLink } from '@/components/ui/sku-link.tsx';

const right: ColumnMeta = { align: 'right' };
export function StockStatus({ line }: { line: ShownLine }) {
  if (!line.stock) return <span className="text-xs text-ink-soft">checking…</span>;
  return line.stock.short > 0 ? (
    <StatusTag tone="danger">short {formatNumber(line.stock.short)}</StatusTag>
  ) : (
    <StatusTag tone="good">enough</StatusTag>
  );
}

/** The bill of materials: what to order, how it is packed, why each line is there, and whether stock covers it. */
export function PlanBomTable({ plan }: { plan: ShownPlan }) {
  // Codes head the columns (they fit a phone); the full name is each header's accessible name.
  const names = new Map(plan.bom.flatMap((l) => l.stock?.availability ?? []).map((a) => [a.warehouse, a.warehouseName]));
  const warehouseKey = warehousesOf(plan)
    .map((code) => `${code}\t${names.get(code) ?? code}`)
    .join('|');
  const columns = useMemo<ColumnDef<ShownLine>[]>(() => {
    const warehouses = warehouseKey ? warehouseKey.split('|').map((w) => w.split('\t') as [string, string]) : [];
    return [
      {
        id: 'sku',
        accessorKey: 'sku',
        header: 'SKU',
        meta: { className: PHONE_HIDDEN },
        cell: (c) => <SkuLink sku={c.row.original.sku} />,
      },
      {
        id: 'name',
        accessorKey: 'name',
        header: 'Part',
        meta: { className: 'sm:min-w-40' },
        cell: (c) => (
          <span>
            {/* On a phone the SKU heads the part's cell instead of taking a column. */}
            <SkuLink sku={c.row.original.sku} className="block text-xs sm:hidden" />
            {c.row.original.name}
            <span className="block text-xs text-ink-soft">{CATEGORY_LABELS[c.row.original.category as CategoryCode] ?? c.row.original.category}</span>
          </span>
        ),
      },
      {
        id: 'qty',
        accessorKey: 'qtyUnits',
        header: () => (
          <span>
            Qty<span className="max-sm:hidden"> (units)</span>
          </span>
        ),
        meta: right,
        cell: (c) => (
          <span className="num whitespace-nowrap">
            {formatNumber(c.row.original.qtyUnits)}
            {c.row.original.lengthM != null && <span className="block text-xs text-ink-soft">{formatNumber(c.row.original.lengthM)} m</span>}
          </span>
        ),
      },
      {
        id: 'packs',
        header: 'Packs × size',
        enableSorting: false,
        meta: { ...right, className: PHONE_HIDDEN },
        cell: (c) => (
          <span className="num whitespace-nowrap">
            {formatNumber(c.row.original.packs)} × {formatNumber(c.row.original.packSize)}
          </span>
        ),
      },
      {
        id: 'price',
        accessorKey: 'unitPriceCents',
        header: 'Unit price',
        meta: { ...right, className: PHONE_HIDDEN },
        cell: (c) => <span className="num whitespace-nowrap">{c.row.original.unitPriceCents != null ? formatMoney(c.row.original.unitPriceCents) : '—'}</span>,
      },
      {
        id: 'total',
        accessorKey: 'lineTotalCents',
        header: 'Line total',
        meta: { ...right, className: PHONE_HIDDEN },
        cell: (c) => <span className="num whitespace-nowrap font-medium">{c.row.original.lineTotalCents != null ? formatMoney(c.row.original.lineTotalCents) : '—'}</span>,
      },
      {
        id: 'why',
        accessorKey: 'reason',
        header: 'Why',
        enableSorting: false,
        meta: { className: `min-w-48 text-ink-soft ${PHONE_HIDDEN}` },
        cell: (c) => (
          <span className="text-xs leading-snug">
            {c.row.original.ruleNumbers.length > 0 && <span className="font-semibold text-ink">{c.row.original.ruleNumbers.length === 1 ? 'Rule' : 'Rules'} {c.row.original.ruleNumbers.join(', ')}: </span>}
            {c.row.original.reason}
          </span>
        ),
      },
      ...warehouses.map<ColumnDef<ShownLine>>(([wh, name]) => ({
        id: `wh-${wh}`,
        header: () => (
          <span title={name}>
            <span aria-hidden="true">{wh}</span>
            <span className="sr-only">{name}</span>
          </span>
        ),
        enableSorting: false,
        meta: { ...right, className: PHONE_HIDDEN },
        cell: (c) => {
          const a = c.row.original.stock?.availability.find((x) => x.warehouse === wh);
          return <span className="num text-ink-soft">{a ? formatNumber(a.available) : '0'}</span>;
        },
      })),
      {
        id: 'available',
        header: () => (
          <>
            <span className="sm:hidden">Stock</span>
            <span className="max-sm:hidden">Available</span>
          </>
        ),
        enableSorting: false,
        meta: right,
        cell: (c) => (
          <span className="inline-flex flex-wrap items-center justify-end gap-x-2 gap-y-0.5">
            {c.row.original.stock && <span className="num max-sm:hidden">{formatNumber(c.row.original.stock.available)}</span>}
            <StockStatus line={c.row.original} />
          </span>
        ),
      },
    ];
  }, [warehouseKey]);
  // A BOM is short and read whole: let the table grow with the page instead of scrolling inside it.
  return (
    <div className="space-y-2">
      <div className="[&>div]:max-h-none print:[&>div]:overflow-visible">
        <DataTable label="Bill of materials" data={plan.bom} columns={columns} getRowId={(l) => l.sku} empty="No parts." />
      </div>
      <MoneyTotals totals={plan.totals} basis={plan.discountPct > 0 ? `Your prices: list less your ${plan.discountPct} % tier discount` : 'List prices'} />
    </div>
  );
}

