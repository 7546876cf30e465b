import { formatMoney } from '@/lib/format.ts';

export interface MoneyTotalsValue {
  subtotalCents: number;
  gstCents: number;
  totalCents: number;
  /** Lines without a price, left out of the sums. */
  unpricedLines: number;
}

/** Subtotal, GST and total under a priced list (a BOM, a job); GST as the shared money helpers worked it out. */
export function MoneyTotals({ totals, basis }: { totals: MoneyTotalsValue; basis: string }) {
  const row = 'flex justify-between gap-6';
  const unpriced = totals.unpricedLines;
  return (
    <div className="flex justify-end">
      <div className="w-full max-w-xs rounded-md border border-line bg-card px-3 py-2 text-sm print:bg-white" data-testid="bom-totals">
        <dl className="space-y-0.5" aria-label="Totals">
          <div className={row}>
            <dt>Subtotal (ex GST)</dt>
            <dd className="num">{formatMoney(totals.subtotalCents)}</dd>
          </div>
          <div className={row}>
            <dt>GST 10 %</dt>
            <dd className="num">{formatMoney(totals.gstCents)}</dd>
          </div>
          <div className={`${row} border-t border-line pt-0.5 font-semibold`}>
            <dt>Total (inc GST)</dt>
            <dd className="num" data-testid="bom-total">
              {formatMoney(totals.totalCents)}
            </dd>
          </div>
        </dl>
        <p className="pt-1 text-xs text-ink-soft">
          {basis}
          {unpriced > 0 ? `; ${unpriced} ${unpriced === 1 ? 'line' : 'lines'} without a price left out` : ''}.
        </p>
      </div>
    </div>
  );
}
