import { useMemo } from 'react';
import type { ColumnDef } from '@tanstack/react-table';
import { CATEGORY_LABELS, type CategoryCode } from '@shared/contracts/part-attributes.ts';
import { DataTable, type ColumnMeta } from '@/components/ui/data-table.tsx';
import { StatusTag } from '@/components/ui/notice.tsx';
import { formatNumber } from '@/lib/format.ts';
import { formatCents } from '@shared/domain/money.ts';
import { warehousesOf, type ShownLine, type ShownPlan } from '../lib/plan-view.ts';
import { SkuLink } from '@/features/catalogue/components/sku-link.tsx';

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
  const warehouseKey = warehousesOf(plan).join('|');
  const columns = useMemo<ColumnDef<ShownLine>[]>(() => {
    const warehouses = warehouseKey ? warehouseKey.split('|') : [];
    return [
      {
        id: 'sku',
        accessorKey: 'sku',
        header: 'SKU',
        cell: (c) => <SkuLink sku={c.row.original.sku} />,
      },
      {
        id: 'name',
        accessorKey: 'name',
        header: 'Part',
        meta: { className: 'min-w-40' },
        cell: (c) => (
          <span>
            {c.row.original.name}
            <span className="block text-xs text-ink-soft">{CATEGORY_LABELS[c.row.original.category as CategoryCode] ?? c.row.original.category}</span>
          </span>
        ),
      },
      {
        id: 'qty',
        accessorKey: 'qtyUnits',
        header: 'Qty (units)',
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
        meta: right,
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
        meta: right,
        cell: (c) => <span className="num whitespace-nowrap">{c.row.original.unitPriceCents != null ? formatCents(c.row.original.unitPriceCents) : '—'}</span>,
      },
      {
        id: 'total',
        accessorKey: 'lineTotalCents',
        header: 'Line total',
        meta: right,
        cell: (c) => <span className="num whitespace-nowrap font-medium">{c.row.original.lineTotalCents != null ? formatCents(c.row.original.lineTotalCents) : '—'}</span>,
      },
      {
        id: 'why',
        accessorKey: 'reason',
        header: 'Why',
        enableSorting: false,
        meta: { className: 'min-w-48 text-ink-soft' },
        cell: (c) => (
          <span className="text-xs leading-snug">
            {c.row.original.ruleNumbers.length > 0 && <span className="font-semibold text-ink">{c.row.original.ruleNumbers.length === 1 ? 'Rule' : 'Rules'} {c.row.original.ruleNumbers.join(', ')}: </span>}
            {c.row.original.reason}
          </span>
        ),
      },
      ...warehouses.map<ColumnDef<ShownLine>>((wh) => ({
        id: `wh-${wh}`,
        header: wh,
        enableSorting: false,
        meta: right,
        cell: (c) => {
          const a = c.row.original.stock?.availability.find((x) => x.warehouse === wh);
          return <span className="num text-ink-soft">{a ? formatNumber(a.available) : '0'}</span>;
        },
      })),
      {
        id: 'available',
        header: 'Available',
        enableSorting: false,
        meta: right,
        cell: (c) => (
          <span className="inline-flex items-center gap-2">
            {c.row.original.stock && <span className="num">{formatNumber(c.row.original.stock.available)}</span>}
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
      <BomTotals totals={plan.totals} />
    </div>
  );
}

/** Subtotal, GST and total of the priced lines: list prices, GST worked out on the total. */
export function BomTotals({ totals }: { totals: ShownPlan['totals'] }) {
  const row = 'flex justify-between gap-6';
  return (
    <div className="flex justify-end">
      <dl className="w-full max-w-xs space-y-0.5 rounded-md border border-line bg-card px-3 py-2 text-sm print:bg-white" aria-label="Totals" data-testid="bom-totals">
        <div className={row}>
          <dt>Subtotal (ex GST)</dt>
          <dd className="num">{formatCents(totals.subtotalCents)}</dd>
        </div>
        <div className={row}>
          <dt>GST 10 %</dt>
          <dd className="num">{formatCents(totals.gstCents)}</dd>
        </div>
        <div className={`${row} border-t border-line pt-0.5 font-semibold`}>
          <dt>Total (inc GST)</dt>
          <dd className="num" data-testid="bom-total">
            {formatCents(totals.totalCents)}
          </dd>
        </div>
        <p className="pt-1 text-xs text-ink-soft">List prices{totals.unpricedLines > 0 ? `; ${plural(totals.unpricedLines, 'line')} without a price left out` : ''}.</p>
      </dl>
    </div>
  );
}

const plural = (n: number, word: string) => `${n} ${word}${n === 1 ? '' : 's'}`;
