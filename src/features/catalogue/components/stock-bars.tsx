import type { PartDetail } from '@shared/contracts/parts.ts';
import { formatNumber } from '@/lib/format.ts';
import { AvailableQty } from './part-status.tsx';

const HATCH = { backgroundImage: 'repeating-linear-gradient(135deg, #8a909a 0 2px, #e6e3dc 2px 6px)' };

/** Stock per warehouse as a bar: available in teal, reserved hatched, numbers beside it. */
export function StockBars({ stock }: { stock: PartDetail['stock'] }) {
  if (stock.length === 0) return <p className="text-sm text-ink-soft">No stock recorded yet. Stock appears here once goods are received into a warehouse.</p>;
  const totalOf = (s: PartDetail['stock'][number]) => Math.max(s.onHand ?? 0, s.available + (s.reserved ?? 0), 0);
  const scale = Math.max(1, ...stock.map(totalOf));
  const showsReserved = stock.some((s) => s.reserved !== undefined);
  const sum = stock.reduce((a, s) => a + s.available, 0);
  return (
    <div>
      <ul className="space-y-2.5">
        {stock.map((s) => {
          const reserved = Math.max(0, s.reserved ?? 0);
          const available = Math.max(0, s.available);
          return (
            <li key={s.warehouse}>
              <div className="mb-0.5 flex flex-wrap items-baseline justify-between gap-x-3 text-sm">
                <span>
                  <span className="font-medium">{s.warehouseName}</span> <span className="num text-xs text-ink-soft">{s.warehouse}</span>
                </span>
                <span className="flex gap-3 text-xs">
                  <span>
                    <AvailableQty available={s.available} /> available
                  </span>
                  {s.reserved !== undefined && (
                    <span className="text-ink-soft">
                      <span className="num text-ink">{formatNumber(s.reserved)}</span> reserved
                    </span>
                  )}
                  {s.onHand !== undefined && (
                    <span className="text-ink-soft">
                      <span className="num text-ink">{formatNumber(s.onHand)}</span> on hand
                    </span>
                  )}
                </span>
              </div>
              <div aria-hidden="true" className="flex h-3 overflow-hidden rounded-sm border border-line bg-paper">
                <div className="h-full bg-teal" style={{ width: `${(available / scale) * 100}%` }} />
                <div className="h-full" style={{ ...HATCH, width: `${(reserved / scale) * 100}%` }} />
              </div>
            </li>
          );
        })}
      </ul>
      <div className="mt-2 flex flex-wrap items-center justify-between gap-2 text-xs text-ink-soft">
        <span className="flex items-center gap-3">
          <span className="inline-flex items-center gap-1">
            <span aria-hidden="true" className="inline-block h-2.5 w-4 rounded-sm bg-teal" /> Available
          </span>
          {showsReserved && (
            <span className="inline-flex items-center gap-1">
              <span aria-hidden="true" className="inline-block h-2.5 w-4 rounded-sm border border-line" style={HATCH} /> Reserved for jobs
            </span>
          )}
        </span>
        {stock.length > 1 && (
          <span>
            All warehouses: <span className="num font-semibold text-ink">{formatNumber(sum)}</span> available
          </span>
        )}
      </div>
    </div>
  );
}
