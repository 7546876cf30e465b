import { Link } from 'react-router';
import { JOB_STATUS_LABELS, JOB_STATUSES } from '@shared/contracts/jobs.ts';
import type { PortalSummary } from '@shared/contracts/portal.ts';
import { Card } from '@/components/ui/page.tsx';
import { StatusTag } from '@/components/ui/notice.tsx';
import { paths } from '@/config/paths.ts';
import { formatDate, formatMoney } from '@/lib/format.ts';
import { usePortalSummary } from '../api/get-summary.ts';

type Item = PortalSummary['attention'][number];

const REASONS: Record<Item['reason'], { tone: 'caution' | 'good' | 'danger' | 'info'; icon: string; label: string; say: (i: Item) => string }> = {
  unpaid: { tone: 'caution', icon: '$', label: 'To pay', say: (i) => (i.amountCents ? `Pay ${formatMoney(i.amountCents)} by card to place the order.` : 'Pay by card to place the order.') },
  backorder: { tone: 'caution', icon: '◐', label: 'Backorder', say: (i) => `${i.units ?? 0} units waiting for stock; see the expected dates, or switch to a plan available now.` },
  ready: { tone: 'good', icon: '▣', label: 'Ready', say: () => 'Packed and ready to collect.' },
  'quote-expiring': { tone: 'caution', icon: '⌛', label: 'Quote lapsing', say: (i) => `Stock held for this quote until ${i.at ? formatDate(i.at) : 'soon'}; order it to keep it.` },
};

/** The installer's home: their jobs by status and what needs doing now. */
export function PortalSummaryPanel() {
  const { data, error } = usePortalSummary();
  if (error) return <p className="text-sm text-danger">{error.message}</p>;
  if (!data) return <p className="text-sm text-ink-soft">Loading your jobs…</p>;
  const counts = new Map(data.byStatus.map((s) => [s.status, s.count]));
  const total = data.byStatus.reduce((s, x) => s + x.count, 0);
  return (
    <div className="grid gap-4 lg:grid-cols-[2fr_1fr]">
      <section aria-labelledby="attention-heading">
        <h2 id="attention-heading" className="mb-2 font-semibold">
          Needs your attention
        </h2>
        {data.attention.length === 0 ? (
          <Card>
            <p className="text-sm text-ink-soft">Nothing is waiting on you.</p>
          </Card>
        ) : (
          <ul className="space-y-2">
            {data.attention.map((i) => {
              const r = REASONS[i.reason];
              return (
                <li key={`${i.id}-${i.reason}`}>
                  <Card className="flex flex-wrap items-start justify-between gap-2 py-3">
                    <div className="min-w-0">
                      <Link to={paths.job.href(i.id)} className="font-mono font-semibold break-words text-copper underline">
                        {i.reference}
                      </Link>
                      <p className="text-sm text-ink-soft">{r.say(i)}</p>
                    </div>
                    <StatusTag tone={r.tone} icon={r.icon}>
                      {r.label}
                    </StatusTag>
                  </Card>
                </li>
              );
            })}
          </ul>
        )}
      </section>
      <section aria-labelledby="by-status-heading">
        <h2 id="by-status-heading" className="mb-2 font-semibold">
          Your jobs by status
        </h2>
        <Card className="py-2">
          {total === 0 ? (
            <p className="text-sm text-ink-soft">No jobs yet. Plan a stack and order it as a job.</p>
          ) : (
            <ul className="divide-y divide-line text-sm">
              {JOB_STATUSES.filter((s) => counts.has(s)).map((s) => (
                <li key={s} className="flex items-center justify-between py-1.5">
                  <Link to={paths.jobs.href(s)} className="hover:text-copper hover:underline">
                    {JOB_STATUS_LABELS[s]}
                  </Link>
                  <span className="font-mono">{counts.get(s)}</span>
                </li>
              ))}
            </ul>
          )}
        </Card>
      </section>
    </div>
  );
}
