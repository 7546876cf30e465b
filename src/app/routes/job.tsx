import { Link, useParams, useSearchParams } from 'react-router';
import { Page, PageLoading, Card } from '@/components/ui/page.tsx';
import { Notice } from '@/components/ui/notice.tsx';
import { paths } from '@/config/paths.ts';
import { formatNumber, formatDate } from '@/lib/format.ts';
import { useJob } from '@/features/jobs/api/get-job.ts';
import { JobStatusTag } from '@/features/jobs/components/job-status.tsx';
import { JobActions } from '@/features/jobs/components/job-actions.tsx';
import { JobLines } from '@/features/jobs/components/job-lines.tsx';
import { JobStock } from '@/features/jobs/components/job-stock.tsx';
import { JobHistory } from '@/features/jobs/components/job-history.tsx';
import { JobPaperwork } from '@/features/jobs/components/job-paperwork.tsx';
import { hasAbility, useMe } from '@/features/auth/api/get-me.ts';
import { JobPageLinks } from '@/components/ui/job-pages.tsx';

export function JobRoute() {
  const { id = '' } = useParams();
  const [search] = useSearchParams();
  const justPaid = search.get('paid') === '1';
  // Back from the card checkout: the webhook confirms the payment moments later, so look again until it has.
  const job = useJob(id, justPaid ? (j) => j.payment !== null : undefined);
  const { data: me } = useMe();
  if (job.error) {
    return (
      <Page title="Job">
        <Notice tone="danger">{job.error.message}</Notice>
        <p className="mt-3 text-sm">
          <Link to={paths.jobs.href()} className="text-copper underline">
            Back to jobs
          </Link>
        </p>
      </Page>
    );
  }
  if (!job.data) {
    return <PageLoading title="Job" what="the job" />;
  }
  const j = job.data;
  const site = [j.siteSuburb, j.sitePostcode].filter(Boolean).join(' ');
  return (
    <Page
      title={j.reference}
      subtitle={
        <span className="flex flex-wrap items-center gap-2">
          <JobStatusTag status={j.status} />
          <span>
            {j.company.name}
            {site ? ` · site ${site}` : ''}
            {j.preferredWarehouse ? ` · from ${j.preferredWarehouse.name}` : ''} · created {formatDate(j.createdAt)}
          </span>
        </span>
      }
      actions={
        <>
          <JobPageLinks id={j.id} here="job" show={warehousePages(j.status, me)} />
          <Link to={paths.jobs.href()} className="no-print inline-flex items-center rounded-md border border-line bg-card px-3 py-1.5 text-sm font-medium hover:border-ink-soft">
            All jobs
          </Link>
        </>
      }
    >
      <div className="space-y-4">
        <JobActions job={j} />
        <JobPaperwork job={j} justPaid={justPaid} />
        {j.holdExpiresAt && j.status === 'draft' && <Notice tone="caution">Stock is held for this quote until {formatDate(j.holdExpiresAt)}. Order the job to keep it.</Notice>}
        {j.backorders.length > 0 && (
          <Notice tone="caution" title="Waiting for stock">
            {j.backorders.reduce((s, b) => s + b.qty, 0)} units are backordered; they are reserved for this job as soon as they arrive, in queue order.
          </Notice>
        )}
        {j.plans.length > 0 && (
          <section aria-labelledby="plans-heading">
            <h2 id="plans-heading" className="mb-2 text-sm font-semibold">
              Stack plans
            </h2>
            <div className="grid gap-2 sm:grid-cols-2">
              {j.plans.map((p) => (
                <Card key={p.id} className="py-2">
                  <Link to={paths.plan.href(p.id)} className="font-semibold hover:text-copper hover:underline">
                    {p.name}
                  </Link>
                  <p className="text-sm text-ink-soft">
                    {p.rangeName}
                    {p.stacks !== null && p.modulesPerStack !== null ? ` · ${p.stacks} × ${p.modulesPerStack} modules` : ''}
                    {p.usableKwh !== null ? ` · ${formatNumber(p.usableKwh)} kWh usable` : ''}
                  </p>
                </Card>
              ))}
            </div>
          </section>
        )}
        <section aria-labelledby="lines-heading">
          <h2 id="lines-heading" className="mb-2 text-sm font-semibold">
            Lines
          </h2>
          <JobLines job={j} />
        </section>
        <JobStock job={j} />
        {(j.contact || j.notes) && (
          <Card>
            {j.contact && <p className="text-sm">Contact: {j.contact}</p>}
            {j.notes && <p className="text-sm">Notes: {j.notes}</p>}
          </Card>
        )}
        <section aria-labelledby="history-heading">
          <h2 id="history-heading" className="mb-2 text-sm font-semibold">
            History
          </h2>
          <JobHistory history={j.history} />
        </section>
      </div>
    </Page>
  );
}

/** The warehouse pages this job has now, for this user: picking while reserved, labels once held, the handover sheet once picked. */
function warehousePages(status: string, me: Parameters<typeof hasAbility>[0]) {
  const pages: string[] = [];
  if (hasAbility(me, 'jobs.pick') && ['reserved', 'picking'].includes(status)) pages.push('pick');
  if (hasAbility(me, 'stock.view') && ['reserved', 'picking'].includes(status)) pages.push('pickList');
  if (hasAbility(me, 'labels.print') && ['reserved', 'part-reserved', 'picking', 'ready', 'dispatched', 'collected'].includes(status)) pages.push('labels');
  if (['ready', 'dispatched', 'collected', 'closed'].includes(status)) pages.push('handover');
  return pages;
}
