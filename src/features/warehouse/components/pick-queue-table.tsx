import { useMemo } from 'react';
import { Link } from 'react-router';
import type { ColumnDef } from '@tanstack/react-table';
import { JOB_STATUS_LABELS } from '@shared/contracts/jobs.ts';
import type { PickQueueItem } from '@shared/contracts/warehouse.ts';
import { DataTable, PHONE_HIDDEN, ROW_ACTION } from '@/components/ui/data-table.tsx';
import { StatusTag } from '@/components/ui/notice.tsx';
import { paths } from '@/config/paths.ts';

const STATE: Record<PickQueueItem['state'], { tone: 'info' | 'caution' | 'good'; icon: string; label: string }> = {
  waiting: { tone: 'info', icon: '○', label: 'Not started' },
  active: { tone: 'good', icon: '▶', label: 'Picking' },
  paused: { tone: 'caution', icon: '‖', label: 'Paused' },
  done: { tone: 'good', icon: '✓', label: 'Picked' },
};

/** Jobs to pick, oldest order first; a row opens the pick screen. */
export function PickQueueTable({ items }: { items: PickQueueItem[] }) {
  const columns = useMemo<ColumnDef<PickQueueItem>[]>(
    () => [
      {
        id: 'reference',
        accessorKey: 'reference',
        header: 'Job',
        cell: (c) => (
          <>
            <Link {...ROW_ACTION} to={paths.pick.href(c.row.original.id)} className="font-semibold hover:text-copper hover:underline">
              {c.row.original.reference}
            </Link>
            <span className="block text-xs text-ink-soft">{c.row.original.company}</span>
          </>
        ),
      },
      {
        id: 'state',
        header: 'Pick',
        accessorFn: (q) => q.state,
        cell: (c) => {
          const s = STATE[c.row.original.state];
          return (
            <span className="flex flex-col items-start gap-0.5">
              <StatusTag tone={s.tone} icon={s.icon}>
                {s.label}
              </StatusTag>
              {c.row.original.picker && <span className="text-xs text-ink-soft">{c.row.original.picker}</span>}
            </span>
          );
        },
      },
      { id: 'status', header: 'Job status', meta: { className: PHONE_HIDDEN }, accessorFn: (q) => JOB_STATUS_LABELS[q.status] },
      { id: 'site', header: 'Site', meta: { className: PHONE_HIDDEN }, accessorFn: (q) => q.siteSuburb ?? '—' },
      { id: 'progress', header: 'Picked', meta: { align: 'right' }, accessorFn: (q) => q.picked, cell: (c) => <span className="num">{`${c.row.original.picked} / ${c.row.original.units}`}</span> },
      { id: 'ordered', header: 'Ordered', meta: { className: PHONE_HIDDEN }, accessorFn: (q) => q.orderedAt ?? '', cell: (c) => <span className="num whitespace-nowrap">{c.row.original.orderedAt?.slice(0, 10) ?? '—'}</span> },
    ],
    [],
  );
  return <DataTable label="Pick queue" data={items} columns={columns} getRowId={(q) => q.id} dense empty="Nothing to pick: every reserved job is picked." />;
}
