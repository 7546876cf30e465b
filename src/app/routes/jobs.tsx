import { useState } from 'react';
import { Link } from 'react-router';
import { JOB_STATUSES, JOB_STATUS_LABELS, type JobStatus } from '@shared/contracts/jobs.ts';
import { Page } from '@/components/ui/page.tsx';
import { Pager } from '@/components/ui/pager.tsx';
import { useUrlFilters } from '@/lib/use-url-filters.ts';
import { Notice } from '@/components/ui/notice.tsx';
import { Button } from '@/components/ui/button.tsx';
import { SelectField, TextField, optionsOf } from '@/components/ui/field.tsx';
import { paths } from '@/config/paths.ts';
import { download } from '@/lib/api-client.ts';
import { hasAbility, useMe } from '@/features/auth/api/get-me.ts';
import { useCustomers } from '@/features/planner/api/get-customers.ts';
import { useJobs } from '@/features/jobs/api/get-jobs.ts';
import { JobsTable } from '@/features/jobs/components/jobs-table.tsx';

const PAGE_SIZE = 50;

export function JobsRoute() {
  const { data: me } = useMe();
  const { get, set, page, setPage } = useUrlFilters();
  const staff = hasAbility(me, 'customers.view');
  const { data: customers = [] } = useCustomers(staff);
  const [problem, setProblem] = useState<string | null>(null);
  const filters = {
    status: get('status') as JobStatus | undefined,
    companyId: get('company'),
    q: get('q'),
    from: get('from'),
    to: get('to'),
  };
  const jobs = useJobs({ ...filters, page, pageSize: PAGE_SIZE });
  const total = jobs.data?.total ?? 0;
  const exportCsv = () => {
    setProblem(null);
    const q = new URLSearchParams(Object.entries(filters).filter((e): e is [string, string] => !!e[1]));
    download(`/jobs.csv?${q}`).catch((e: Error) => setProblem(e.message));
  };

  return (
    <Page
      title="Jobs"
      subtitle={staff ? 'Every customer account’s jobs, newest first.' : `Jobs for ${me?.company?.name ?? 'your company'}.`}
      actions={
        <>
          <Button onClick={exportCsv}>↓ Export CSV</Button>
          {hasAbility(me, 'jobs.create') && (
            <Link to={paths.jobNew.href()} className="inline-flex items-center rounded-md border border-copper bg-copper px-3 py-1.5 text-sm font-medium text-white hover:bg-copper-dark">
              New job
            </Link>
          )}
        </>
      }
    >
      <form role="search" aria-label="Filter jobs" className="mb-3 grid gap-2 sm:grid-cols-3 lg:grid-cols-6" onSubmit={(e) => e.preventDefault()}>
        <TextField label="Reference" type="search" placeholder="Search references" defaultValue={filters.q ?? ''} onChange={(e) => set('q', e.target.value)} className="lg:col-span-2" />
        <SelectField label="Status" value={filters.status ?? ''} onChange={(e) => set('status', e.target.value)} options={optionsOf(JOB_STATUSES, JOB_STATUS_LABELS)}>
          <option value="">Any status</option>
        </SelectField>
        {staff && (
          <SelectField label="Customer" value={filters.companyId ?? ''} onChange={(e) => set('company', e.target.value)} options={customers.map((c) => ({ value: c.id, label: c.name }))}>
            <option value="">All customers</option>
          </SelectField>
        )}
        <TextField label="Created from" type="date" value={filters.from ?? ''} onChange={(e) => set('from', e.target.value)} />
        <TextField label="Created to" type="date" value={filters.to ?? ''} onChange={(e) => set('to', e.target.value)} />
      </form>
      {problem && <Notice tone="danger">{problem}</Notice>}
      {jobs.error && <Notice tone="danger">{jobs.error.message}</Notice>}
      {jobs.isLoading ? <p className="text-sm text-ink-soft">Loading jobs…</p> : <JobsTable jobs={jobs.data?.data ?? []} showCustomer={staff} />}
      <Pager page={page} pageSize={PAGE_SIZE} total={total} noun={total === 1 ? 'job' : 'jobs'} onPage={setPage} labels={['← Newer', 'Older →']} />
    </Page>
  );
}
