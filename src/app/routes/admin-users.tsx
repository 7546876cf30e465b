import { useDeferredValue, useEffect, useMemo, useRef, useState } from 'react';
import type { ColumnDef } from '@tanstack/react-table';
import type { UserRow } from '@shared/contracts/users.ts';
import { ROLE_LABELS } from '@shared/roles.ts';
import { Page, Card } from '@/components/ui/page.tsx';
import { DataTable, ROW_ACTION } from '@/components/ui/data-table.tsx';
import { Button } from '@/components/ui/button.tsx';
import { TextField } from '@/components/ui/field.tsx';
import { Notice, StatusTag } from '@/components/ui/notice.tsx';
import { formatDate } from '@/lib/format.ts';
import { useUsers } from '@/features/users/api/get-users.ts';
import { NewUserForm } from '@/features/users/components/user-form.tsx';
import { UserEditor } from '@/features/users/components/user-editor.tsx';

/** The server lists users by name. */
const BY_NAME = [{ id: 'name', desc: false }];

export function AdminUsersRoute() {
  const [q, setQ] = useState('');
  const deferred = useDeferredValue(q.trim());
  const { data = [], error, isLoading } = useUsers(deferred);
  const [creating, setCreating] = useState(false);
  const [editingId, setEditingId] = useState<string | null>(null);
  const [created, setCreated] = useState<string | null>(null);
  const editing = data.find((u) => u.id === editingId) ?? null;
  const editorHeading = useRef<HTMLHeadingElement>(null);
  // Where focus goes back to when the editor closes: the row's button that opened it.
  const opener = useRef<HTMLElement | null>(null);

  // Opening a user moves focus to their editor, so a screen reader announces what opened.
  useEffect(() => {
    if (editingId) editorHeading.current?.focus();
  }, [editingId]);

  const columns = useMemo<ColumnDef<UserRow>[]>(
    () => [
      {
        accessorKey: 'name',
        header: 'Name',
        cell: (c) => (
          <button
            type="button"
            {...ROW_ACTION}
            onClick={(e) => {
              opener.current = e.currentTarget;
              setEditingId(c.row.original.id);
            }}
            className="text-left font-semibold hover:text-copper hover:underline"
          >
            {c.row.original.name}
            {/* A phone has no status column: a deactivated user says so under the name. */}
            {!c.row.original.active && <span className="block text-xs font-normal text-danger sm:hidden">Deactivated</span>}
          </button>
        ),
      },
      { accessorKey: 'email', header: 'E-mail', meta: { className: 'max-sm:hidden' }, cell: (c) => <span className="num break-all text-xs">{c.getValue<string>()}</span> },
      { accessorKey: 'role', header: 'Role', cell: (c) => ROLE_LABELS[c.getValue<UserRow['role']>()] },
      { accessorKey: 'companyName', header: 'Company' },
      {
        accessorKey: 'active',
        header: 'Status',
        meta: { className: 'max-sm:hidden' },
        cell: (c) => (c.getValue<boolean>() ? <StatusTag tone="good">Active</StatusTag> : <StatusTag tone="danger">Deactivated</StatusTag>),
      },
      { accessorKey: 'createdAt', header: 'Since', meta: { className: 'max-sm:hidden' }, cell: (c) => <span className="whitespace-nowrap">{formatDate(c.getValue<string>())}</span> },
    ],
    [],
  );

  const closeEditor = () => {
    setEditingId(null);
    opener.current?.focus();
  };

  return (
    <Page
      title="Users"
      subtitle="Who can sign in, with which role and for which company. There is no self sign-up."
      actions={
        !creating && (
          <Button variant="primary" onClick={() => setCreating(true)}>
            New user
          </Button>
        )
      }
    >
      {creating && (
        <Card className="mb-4">
          <h2 className="mb-3 font-semibold">New user</h2>
          <NewUserForm
            onCancel={() => setCreating(false)}
            onDone={(u) => {
              setCreating(false);
              setCreated(`${u.name} can now sign in as ${u.email}.`);
            }}
          />
        </Card>
      )}
      <div aria-live="polite">
        {created && (
          <div className="mb-4">
            <Notice tone="good">{created}</Notice>
          </div>
        )}
      </div>
      <div className="mb-3 max-w-sm">
        <TextField label="Search users" type="search" placeholder="Name, e-mail or company" value={q} onChange={(e) => setQ(e.target.value)} />
      </div>
      {error && <Notice tone="danger">{error.message}</Notice>}
      {editing && (
        <Card className="mb-4">
          <section aria-labelledby="user-editor-title">
            <h2 id="user-editor-title" ref={editorHeading} tabIndex={-1} className="mb-3 font-semibold outline-none">
              {editing.name} <span className="num break-all text-xs font-normal text-ink-soft">{editing.email}</span>
            </h2>
            <UserEditor key={editing.id} user={editing} onClose={closeEditor} />
          </section>
        </Card>
      )}
      <DataTable label="Users" data={data} columns={columns} getRowId={(u) => u.id} initialSorting={BY_NAME} empty={isLoading ? 'Loading…' : 'No users match.'} />
    </Page>
  );
}
