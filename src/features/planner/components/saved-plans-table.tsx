import { useMemo } from 'react';
import { Link } from 'react-router';
import type { ColumnDef } from '@tanstack/react-table';
import type { SavedPlan } from '@shared/contracts/stack-plans.ts';
import { DataTable, ROW_ACTION } from '@/components/ui/data-table.tsx';
import { paths } from '@/config/paths.ts';
import { formatDate, formatNumber } from '@/lib/format.ts';

const NEWEST_FIRST = [{ id: 'created', desc: true }];

/** Draft plans, newest first; a row opens the plan recomputed with today's stock. */
export function SavedPlansTable({ plans, showCustomer }: { plans: SavedPlan[]; showCustomer: boolean }) {
  const columns = useMemo<ColumnDef<SavedPlan>[]>(
    () => [
      {
        id: 'name',
        accessorKey: 'name',
        header: 'Plan',
        cell: (c) => (
          <>
            <Link to={paths.plan.href(c.row.original.id)} {...ROW_ACTION} className="font-semibold hover:text-copper hover:underline">
              {c.row.original.name}
            </Link>
            {/* A phone has no room for the customer column: the customer rides with the plan. */}
            {showCustomer && <span className="block text-xs text-ink-soft sm:hidden">{c.row.original.companyName}</span>}
          </>
        ),
      },
      ...(showCustomer ? [{ id: 'customer', accessorKey: 'companyName', header: 'Customer', meta: { className: 'max-sm:hidden' } } satisfies ColumnDef<SavedPlan>] : []),
      {
        id: 'site',
        header: 'Site',
        meta: { className: 'max-sm:hidden' },
        accessorFn: (p) => [p.siteSuburb, p.sitePostcode].filter(Boolean).join(' '),
        cell: (c) => c.getValue<string>() || <span className="text-ink-soft">—</span>,
      },
      { id: 'range', accessorKey: 'rangeName', header: 'Range', meta: { className: 'max-sm:hidden' } },
      {
        id: 'layout',
        accessorFn: (p) => p.stacks * 100 + p.modulesPerStack,
        cell: (c) => (
          <span className="num whitespace-nowrap">
            {c.row.original.stacks} × {c.row.original.modulesPerStack}
          </span>
        ),
        meta: { className: 'whitespace-nowrap max-sm:hidden' },
        header: () => (
          <span>
            Layout <span className="normal-case">(stacks × modules)</span>
          </span>
        ),
      },
      {
        id: 'usable',
        accessorKey: 'usableKwh',
        header: 'Usable',
        meta: { align: 'right' },
        cell: (c) => (
          <span className="whitespace-nowrap">
            <span className="num">{formatNumber(c.row.original.usableKwh)}</span> kWh
          </span>
        ),
      },
      { id: 'by', accessorKey: 'createdBy', header: 'Planned by', meta: { className: 'max-sm:hidden' } },
      { id: 'created', accessorKey: 'createdAt', header: 'Saved', cell: (c) => <span className="num whitespace-nowrap">{formatDate(c.row.original.createdAt)}</span> },
    ],
    [showCustomer],
  );
  // The server lists plans newest first.
  return <DataTable label="Saved plans" data={plans} columns={columns} getRowId={(p) => p.id} initialSorting={NEWEST_FIRST} empty="No saved plans yet. Plan a stack and save it as a draft." />;
}
