import { useState } from 'react';
import { ROLES, ROLE_LABELS, type Role } from '@shared/roles.ts';
import type { UserRow } from '@shared/contracts/users.ts';
import { SelectField, TextField, optionsOf } from '@/components/ui/field.tsx';
import { Button } from '@/components/ui/button.tsx';
import { Notice } from '@/components/ui/notice.tsx';
import { useCompanies } from '../api/get-companies.ts';
import { useResetPassword, useUpdateUser } from '../api/save-user.ts';

/** Role, company, deactivation and password for one user. */
export function UserEditor({ user, onClose }: { user: UserRow; onClose: () => void }) {
  const { data: companies = [] } = useCompanies();
  const update = useUpdateUser();
  const reset = useResetPassword();
  const [role, setRole] = useState<Role>(user.role);
  const [companyId, setCompanyId] = useState(user.companyId ?? '');
  const [password, setPassword] = useState('');
  const [message, setMessage] = useState<{ tone: 'good' | 'danger'; text: string } | null>(null);
  const choices = companies.filter((c) => (role === 'installer' ? c.kind === 'installer' : c.kind === 'wholesaler'));
  const fail = (e: Error) => setMessage({ tone: 'danger', text: e.message });

  return (
    <div className="space-y-4" aria-label={`Edit ${user.name}`}>
      <div className="grid gap-3 sm:grid-cols-3">
        <SelectField label="Role" value={role} onChange={(e) => setRole(e.target.value as Role)} options={optionsOf(ROLES, ROLE_LABELS)} />
        <SelectField label="Company" value={companyId} onChange={(e) => setCompanyId(e.target.value)}>
          <option value="">{role === 'installer' ? 'Choose a customer company…' : 'The wholesaler'}</option>
          {choices.map((c) => (
            <option key={c.id} value={c.id}>
              {c.name}
            </option>
          ))}
        </SelectField>
        <div className="flex items-end gap-2">
          <Button
            variant="primary"
            disabled={update.isPending}
            onClick={() =>
              update.mutate(
                { id: user.id, input: { role, companyId: companyId || null } },
                { onSuccess: () => setMessage({ tone: 'good', text: 'Role and company saved.' }), onError: fail },
              )
            }
          >
            Save
          </Button>
        </div>
      </div>
      <div className="grid gap-3 sm:grid-cols-3">
        <TextField label="New password" type="password" autoComplete="new-password" value={password} onChange={(e) => setPassword(e.target.value)} hint="Ends all of their sessions." />
        <div className="flex items-end">
          <Button
            disabled={password.length === 0 || reset.isPending}
            onClick={() =>
              reset.mutate(
                { id: user.id, password },
                { onSuccess: () => { setPassword(''); setMessage({ tone: 'good', text: 'Password set. Their other sessions were signed out.' }); }, onError: fail },
              )
            }
          >
            Set password
          </Button>
        </div>
        <div className="flex items-end justify-end gap-2">
          <Button
            variant={user.active ? 'danger' : 'secondary'}
            onClick={() =>
              update.mutate(
                { id: user.id, input: { active: !user.active } },
                { onSuccess: (u) => setMessage({ tone: 'good', text: u.active ? 'Reactivated.' : 'Deactivated: they can no longer sign in.' }), onError: fail },
              )
            }
          >
            {user.active ? 'Deactivate' : 'Reactivate'}
          </Button>
          <Button variant="ghost" onClick={onClose}>
            Close
          </Button>
        </div>
      </div>
      {message && <Notice tone={message.tone}>{message.text}</Notice>}
    </div>
  );
}
