import type { Job } from '@shared/contracts/jobs.ts';
import { formatMoney } from '@/lib/format.ts';

/** The job's lines: what it needs, what is held, what waits; available and short, never on hand. */
export function JobLines({ job }: { job: Job }) {
  if (job.lines.length === 0) return <p className="text-sm text-ink-soft">The plans’ parts are copied in when the job is ordered.</p>;
  return (
    <div className="rounded-lg border border-line bg-card">
      <div className="overflow-x-auto">
      <table className="w-full min-w-[640px] border-collapse text-sm" aria-label="Job lines">
        <thead className="bg-[#efece4] text-xs uppercase tracking-wide text-ink-soft">
          <tr>
            <th scope="col" className="px-2 py-2 text-left">SKU / part</th>
            <th scope="col" className="px-2 py-2 text-right">Qty</th>
            <th scope="col" className="px-2 py-2 text-right">Reserved</th>
            <th scope="col" className="px-2 py-2 text-right">Backordered</th>
            <th scope="col" className="px-2 py-2 text-right">Available</th>
            <th scope="col" className="px-2 py-2 text-right">Unit ex GST</th>
            <th scope="col" className="px-2 py-2 text-right">Line ex GST</th>
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
              </td>
              <td className="num px-2 py-1.5 text-right">{l.qty}</td>
              <td className="num px-2 py-1.5 text-right">{l.reserved === l.qty ? <span className="text-teal">✓ {l.reserved}</span> : l.reserved}</td>
              <td className="num px-2 py-1.5 text-right">{l.backordered ? <span className="font-semibold text-danger">◌ {l.backordered}</span> : '0'}</td>
              <td className="num px-2 py-1.5 text-right">
                {l.available}
                {l.short > 0 && <span className="block text-xs font-semibold text-danger">short {l.short}</span>}
              </td>
              <td className="num px-2 py-1.5 text-right">{l.unitPriceCents === null ? '—' : formatMoney(l.unitPriceCents)}</td>
              <td className="num px-2 py-1.5 text-right">{l.lineTotalCents === null ? '—' : formatMoney(l.lineTotalCents)}</td>
            </tr>
          ))}
        </tbody>
      </table>
      </div>
      <dl className="ml-auto grid w-full max-w-xs grid-cols-[1fr_auto] gap-x-4 gap-y-0.5 border-t border-line px-2 py-2 text-sm">
        <dt className="text-right">Subtotal ex GST</dt>
        <dd className="num text-right">{formatMoney(job.totals.subtotalCents)}</dd>
        <dt className="text-right">GST 10 %</dt>
        <dd className="num text-right">{formatMoney(job.totals.gstCents)}</dd>
        <dt className="text-right font-semibold">Total inc GST</dt>
        <dd className="num text-right font-semibold">{formatMoney(job.totals.totalCents)}</dd>
      </dl>
      {job.totals.unpricedLines > 0 && <p className="px-2 pb-2 text-xs text-ink-soft">{job.totals.unpricedLines} line(s) have no list price yet and are left out of the totals.</p>}
    </div>
  );
}
