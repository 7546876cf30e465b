import type { Job } from '@shared/contracts/jobs.ts';
import { formatDate } from '@/lib/format.ts';

/** Where the job's units are held (warehouse and bin) and what it is queued for. */
export function JobStock({ job }: { job: Job }) {
  return (
    <div className="grid gap-4 md:grid-cols-2">
      <section aria-labelledby="held-heading">
        <h2 id="held-heading" className="mb-2 text-sm font-semibold">
          Reserved stock
        </h2>
        {job.reservations.length === 0 ? (
          <p className="text-sm text-ink-soft">Nothing is held for this job.</p>
        ) : (
          <ul className="divide-y divide-line/70 rounded-lg border border-line bg-card text-sm">
            {job.reservations.map((r) => (
              <li key={`${r.sku}-${r.warehouse}-${r.bin}`} className="flex flex-wrap items-baseline justify-between gap-2 px-3 py-1.5">
                <span>
                  <span className="num font-semibold">{r.qty} × {r.sku}</span>
                </span>
                <span className="num text-ink-soft">
                  {r.warehouse} · bin {r.bin}
                  {r.needsTransfer && <span className="ml-2 rounded border border-amber/50 bg-amber-soft px-1 text-xs text-[#7a4f12]">⇄ needs transfer</span>}
                  {r.expiresAt && <span className="ml-2 text-xs">quote hold until {formatDate(r.expiresAt)}</span>}
                </span>
              </li>
            ))}
          </ul>
        )}
      </section>
      <section aria-labelledby="waiting-heading">
        <h2 id="waiting-heading" className="mb-2 text-sm font-semibold">
          Backorders
        </h2>
        {job.backorders.length === 0 ? (
          <p className="text-sm text-ink-soft">Nothing is waiting for stock.</p>
        ) : (
          <ul className="divide-y divide-line/70 rounded-lg border border-danger/30 bg-card text-sm">
            {job.backorders.map((b) => (
              <li key={b.sku} className="flex flex-wrap items-baseline justify-between gap-2 px-3 py-1.5">
                <span className="num font-semibold text-danger">◌ {b.qty} × {b.sku}</span>
                <span className="text-ink-soft">
                  No. {b.position} in the queue{b.unitsAhead ? ` (${b.unitsAhead} units ahead)` : ''} · since {formatDate(b.since)}
                </span>
              </li>
            ))}
          </ul>
        )}
      </section>
    </div>
  );
}
