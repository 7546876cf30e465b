import { useMemo } from 'react';
import { Link } from 'react-router';
import type { ColumnDef } from '@tanstack/react-table';
import type { JobSummary } from '@shared/contracts/jobs.ts';
import { DataTable, PHONE_HIDDEN, ROW_ACTION } from '@/components/ui/data-table.tsx';
import { paths } from '@/config/paths.ts';
import { JobStatusTag } from './job-status.tsx';
import { formatDate } from '@/lib/format.ts';

/** Jobs, newest first; a row opens the job. */
export function JobsTable({ jobs, showCustomer }: { jobs: JobSummary[]; showCustomer: boolean }) {
  const columns = useMemo<ColumnDef<JobSummary>[]>(
    () => [
      {
        id: 'reference',
        accessorKey: 'reference',
        header: 'Reference',
        cell: (c) => (
          <>
            <Link {...ROW_ACTION} to={paths.job.href(c.row.original.id)} className="font-semibold hover:text-copper hover:underline">
              {c.row.original.reference}
            </Link>
            {showCustomer && <span className="block text-xs text-ink-soft sm:hidden">{c.row.original.company.name}</span>}
          </>
        ),
      },
      { id: 'status', accessorKey: 'status', header: 'Status', cell: (c) => <JobStatusTag status={c.row.original.status} /> },
      ...(showCustomer ? [{ id: 'customer', accessorFn: (j: JobSummary) => j.company.name, header: 'Customer', meta: { className: PHONE_HIDDEN } } satisfies ColumnDef<JobSummary>] : []),
      {
        id: 'site',
        header: 'Site',
        meta: { className: PHONE_HIDDEN },
        accessorFn: (j) => [j.siteSuburb, j.sitePostcode].filter(Boolean).join(' '),
        cell: (c) => c.getValue<string>() || <span className="text-ink-soft">—</span>,
      },
      { id: 'units', accessorKey: 'units', header: 'Units', meta: { align: 'right', className: PHONE_HIDDEN }, cell: (c) => <span className="num">{c.row.original.units}</span> },
      { id: 'reserved', accessorKey: 'reserved', header: 'Reserved', meta: { align: 'right', className: PHONE_HIDDEN }, cell: (c) => <span className="num">{c.row.original.reserved}</span> },
      {
        id: 'backordered',
        accessorKey: 'backordered',
        header: 'Backordered',
        meta: { align: 'right' },
        cell: (c) => (c.row.original.backordered ? <span className="num font-semibold text-danger">{c.row.original.backordered}</span> : <span className="num text-ink-soft">0</span>),
      },
      { id: 'created', accessorKey: 'createdAt', header: 'Created', meta: { className: PHONE_HIDDEN }, cell: (c) => <span className="num whitespace-nowrap">{formatDate(c.row.original.createdAt)}</span> },
    ],
    [showCustomer],
  );
  return <DataTable label="Jobs" data={jobs} columns={columns} getRowId={(j) => j.id} dense empty="No jobs match. Clear the filters or order a saved plan." />;
}
