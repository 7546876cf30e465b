import type { Job } from '@shared/contracts/jobs.ts';
import { formatMoney } from '@/lib/format.ts';
import { MoneyTotals } from '@/components/ui/money-totals.tsx';

/** The job's lines: what it needs, what is held, what waits; available and short, never on hand. */
export function JobLines({ job }: { job: Job }) {
  if (job.lines.length === 0) return <p className="text-sm text-ink-soft">The plans’ parts are copied in when the job is ordered.</p>;
  return (
    <div className="rounded-lg border border-line bg-card">
      <div className="overflow-x-auto">
      <table className="w-full border-collapse sm:min-w-[640px] text-sm" aria-label="Job lines">
        <thead className="bg-[#efece4] text-xs uppercase tracking-wide text-ink-soft">
          <tr>
            <th scope="col" className="px-2 py-2 text-left">SKU / part</th>
            <th scope="col" className="px-2 py-2 text-right">Qty</th>
            <th scope="col" className="px-2 py-2 text-right">Reserved</th>
            <th scope="col" className="px-2 py-2 text-right">Backordered</th>
            <th scope="col" className="max-sm:hidden px-2 py-2 text-right">Available</th>
            <th scope="col" className="max-sm:hidden px-2 py-2 text-right">Unit ex GST</th>
            <th scope="col" className="max-sm:hidden px-2 py-2 text-right">Line ex GST</th>
          </tr>
        </thead>
        <tbody>
          {job.lines.map((l) => (
            <tr key={l.id} className="border-t border-line/70 align-top">
              <td className="px-2 py-1.5">
                <span className="num font-semibold">{l.sku}</span> <span>{l.name}</span>
                <span className="block text-xs text-ink-soft">
                  {l.plan ? `From plan “${l.plan.name}”` : 'Added by SKU'}
                  {l.reason && l.plan ? ` · ${l.reason}` : ''}
                </span>
                {/* On a phone the availability and price columns fold into the line. */}
                <span className="num block text-xs sm:hidden">
                  {l.available} available{l.short > 0 ? ` · short ${l.short}` : ''}
                  {l.lineTotalCents !== null ? ` · ${formatMoney(l.lineTotalCents)} ex GST` : ''}
                </span>
              </td>
              <td className="num px-2 py-1.5 text-right">{l.qty}</td>
              <td className="num px-2 py-1.5 text-right">{l.reserved === l.qty ? <span className="text-teal">✓ {l.reserved}</span> : l.reserved}</td>
              <td className="num px-2 py-1.5 text-right">{l.backordered ? <span className="font-semibold text-danger">◌ {l.backordered}</span> : '0'}</td>
              <td className="num max-sm:hidden px-2 py-1.5 text-right">
                {l.available}
                {l.short > 0 && <span className="block text-xs font-semibold text-danger">short {l.short}</span>}
              </td>
              <td className="num max-sm:hidden px-2 py-1.5 text-right">{l.unitPriceCents === null ? '—' : formatMoney(l.unitPriceCents)}</td>
              <td className="num max-sm:hidden px-2 py-1.5 text-right">{l.lineTotalCents === null ? '—' : formatMoney(l.lineTotalCents)}</td>
            </tr>
          ))}
        </tbody>
      </table>
      </div>
      <div className="p-2">
        <MoneyTotals totals={job.totals} basis="Prices as fixed when ordered, the customer’s tier discount included" />
      </div>
    </div>
  );
}
