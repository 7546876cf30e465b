import { useDeferredValue, useMemo } from 'react';
import { Link } from 'react-router';
import type { ColumnDef } from '@tanstack/react-table';
import { MAIL_EVENT_LABELS, OUTBOX_PAGE_SIZE, type OutboxRow } from '@shared/contracts/mail.ts';
import { Page } from '@/components/ui/page.tsx';
import { DataTable, PHONE_HIDDEN, ROW_ACTION } from '@/components/ui/data-table.tsx';
import { TextField } from '@/components/ui/field.tsx';
import { Notice } from '@/components/ui/notice.tsx';
import { Pager } from '@/components/ui/pager.tsx';
import { paths } from '@/config/paths.ts';
import { formatDateTime } from '@/lib/format.ts';
import { useUrlFilters } from '@/lib/use-url-filters.ts';
import { useOutbox } from '@/features/mail/api/get-outbox.ts';
import { MailStatusTag } from '@/features/mail/components/mail-status.tsx';

/** Every message the app has written, newest first: what went to whom, and whether it arrived. */
export function AdminOutboxRoute() {
  // In the address, so a message opened and closed again comes back to the same filtered page.
  const filters = useUrlFilters();
  const to = filters.get('to') ?? '';
  const { page, setPage } = filters;
  const deferred = useDeferredValue(to.trim());
  const { data, error, isLoading } = useOutbox(deferred, page);
  const columns = useMemo<ColumnDef<OutboxRow>[]>(
    () => [
      {
        accessorKey: 'subject',
        header: 'Subject',
        enableSorting: false,
        cell: (c) => (
          <Link {...ROW_ACTION} to={paths.outboxMessage.href(c.row.original.id)} className="font-semibold break-words hover:text-copper hover:underline">
            {c.row.original.subject}
            <span className="block text-xs font-normal text-ink-soft break-all sm:hidden">{c.row.original.to}</span>
          </Link>
        ),
      },
      { accessorKey: 'to', header: 'To', enableSorting: false, meta: { className: PHONE_HIDDEN }, cell: (c) => <span className="num break-all text-xs">{c.getValue<string>()}</span> },
      { accessorKey: 'event', header: 'About', enableSorting: false, meta: { className: PHONE_HIDDEN }, cell: (c) => MAIL_EVENT_LABELS[c.row.original.event] },
      { accessorKey: 'createdAt', header: 'Written', enableSorting: false, meta: { className: PHONE_HIDDEN }, cell: (c) => <span className="num whitespace-nowrap">{formatDateTime(c.row.original.createdAt)}</span> },
      { accessorKey: 'status', header: 'State', enableSorting: false, cell: (c) => <MailStatusTag status={c.row.original.status} /> },
    ],
    [],
  );
  return (
    <Page title="Outbox" subtitle="Every e-mail Stackyard has written, newest first. Waiting messages go out within a minute; refused ones are tried again.">
      <div className="mb-3 max-w-sm">
        <TextField
          label="Recipient"
          type="search"
          placeholder="Part of an e-mail address"
          value={to}
          onChange={(e) => filters.set('to', e.target.value)}
        />
      </div>
      {error && <Notice tone="danger">{error.message}</Notice>}
      {isLoading ? <p className="text-sm text-ink-soft">Loading the outbox…</p> : <DataTable label="Outbox" data={data?.data ?? []} columns={columns} getRowId={(r) => r.id} empty={deferred ? 'No message to that address.' : 'No e-mail has been written yet.'} />}
      {data && <Pager page={page} pageSize={OUTBOX_PAGE_SIZE} total={data.total} noun="messages" onPage={setPage} />}
    </Page>
  );
}
