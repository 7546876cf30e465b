import { useDeferredValue, useMemo, useState } from 'react';
import type { ColumnDef } from '@tanstack/react-table';
import type { UserRow } from '@shared/contracts/users.ts';
import { ROLE_LABELS } from '@shared/roles.ts';
import { Page, Card } from '@/components/ui/page.tsx';
import { DataTable } from '@/components/ui/data-table.tsx';
import { Button } from '@/components/ui/button.tsx';
import { TextField } from '@/components/ui/field.tsx';
import { Notice, StatusTag } from '@/components/ui/notice.tsx';
import { useUsers } from '@/features/users/api/get-users.ts';
import { NewUserForm } from '@/features/users/components/user-form.tsx';
import { UserEditor } from '@/features/users/components/user-editor.tsx';

export function AdminUsersRoute() {
  const [q, setQ] = useState('');
  const deferred = useDeferredValue(q.trim());
  const { data = [], error, isLoading } = useUsers(deferred);
  const [creating, setCreating] = useState(false);
  const [editingId, setEditingId] = useState<string | null>(null);
  const [created, setCreated] = useState<string | null>(null);
  const editing = data.find((u) => u.id === editingId) ?? null;

  const columns = useMemo<ColumnDef<UserRow>[]>(
    () => [
      { accessorKey: 'name', header: 'Name' },
      { accessorKey: 'email', header: 'E-mail', cell: (c) => <span className="num text-xs">{c.getValue<string>()}</span> },
      { accessorKey: 'role', header: 'Role', cell: (c) => ROLE_LABELS[c.getValue<UserRow['role']>()] },
      { accessorKey: 'companyName', header: 'Company' },
      {
        accessorKey: 'active',
        header: 'Status',
        cell: (c) => (c.getValue<boolean>() ? <StatusTag tone="good">Active</StatusTag> : <StatusTag tone="danger">Deactivated</StatusTag>),
      },
    ],
    [],
  );

  return (
    <Page
      title="Users"
      subtitle="Who can sign in, with which role and for which company. There is no self sign-up."
      actions={
        <Button variant="primary" onClick={() => setCreating((c) => !c)}>
          {creating ? 'Cancel' : 'New user'}
        </Button>
      }
    >
      {creating && (
        <Card className="mb-4">
          <h2 className="mb-3 font-semibold">New user</h2>
          <NewUserForm
            onDone={(u) => {
              setCreating(false);
              setCreated(`${u.name} can now sign in as ${u.email}.`);
            }}
          />
        </Card>
      )}
      {created && (
        <div className="mb-4">
          <Notice tone="good">{created}</Notice>
        </div>
      )}
      <div className="mb-3 max-w-sm">
        <TextField label="Search users" type="search" placeholder="Name, e-mail or company" value={q} onChange={(e) => setQ(e.target.value)} />
      </div>
      {error && <Notice tone="danger">{error.message}</Notice>}
      {editing && (
        <Card className="mb-4">
          <h2 className="mb-3 font-semibold">
            {editing.name} <span className="num text-xs font-normal text-ink-soft">{editing.email}</span>
          </h2>
          <UserEditor key={editing.id} user={editing} onClose={() => setEditingId(null)} />
        </Card>
      )}
      <DataTable label="Users" data={data} columns={columns} getRowId={(u) => u.id} onOpen={(u) => setEditingId(u.id)} empty={isLoading ? 'Loading…' : 'No users match.'} />
    </Page>
  );
}
