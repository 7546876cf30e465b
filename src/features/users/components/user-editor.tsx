import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { ROLES, ROLE_LABELS } from '@shared/roles.ts';
import { ResetPasswordSchema, UserAccessSchema, type ResetPasswordInput, type UserAccessInput, type UserRow } from '@shared/contracts/users.ts';
import { SelectField, TextField, optionsOf } from '@/components/ui/field.tsx';
import { Button } from '@/components/ui/button.tsx';
import { Notice } from '@/components/ui/notice.tsx';
import { applyServerErrors } from '@/lib/form-errors.ts';
import { useCompanies } from '../api/get-companies.ts';
import { useResetPassword, useUpdateUser } from '../api/save-user.ts';
import { CompanyField } from './company-field.tsx';

type Message = { tone: 'good' | 'danger'; text: string } | null;

/** Role, company, deactivation and password for one user: two small forms, the same approach as the new-user form. */
export function UserEditor({ user, onClose }: { user: UserRow; onClose: () => void }) {
  const { data: companies = [] } = useCompanies();
  const update = useUpdateUser();
  const reset = useResetPassword();
  const [message, setMessage] = useState<Message>(null);
  const access = useForm<UserAccessInput>({ resolver: zodResolver(UserAccessSchema), defaultValues: { role: user.role, companyId: user.companyId } });
  const password = useForm<ResetPasswordInput>({ resolver: zodResolver(ResetPasswordSchema), defaultValues: { password: '' } });
  const fail = (text: string | null) => text && setMessage({ tone: 'danger', text });

  const saveAccess = access.handleSubmit((input) => {
    setMessage(null);
    update.mutate(
      { id: user.id, input },
      { onSuccess: () => setMessage({ tone: 'good', text: 'Role and company saved.' }), onError: (e) => fail(applyServerErrors(e, access.setError, ['role', 'companyId'])) },
    );
  });
  const setPassword = password.handleSubmit(({ password: value }) => {
    setMessage(null);
    reset.mutate(
      { id: user.id, password: value },
      {
        onSuccess: () => {
          password.reset();
          setMessage({ tone: 'good', text: 'Password set. Their other sessions were signed out.' });
        },
        onError: (e) => fail(applyServerErrors(e, password.setError, ['password'])),
      },
    );
  });

  return (
    <div className="space-y-4">
      <form onSubmit={saveAccess} noValidate className="grid gap-3 sm:grid-cols-3" aria-label="Role and company">
        <SelectField label="Role" error={access.formState.errors.role?.message} {...access.register('role')} options={optionsOf(ROLES, ROLE_LABELS)} />
        <CompanyField form={access} companies={companies} error={access.formState.errors.companyId?.message} />
        <div className="flex items-end gap-2">
          <Button type="submit" variant="primary" disabled={update.isPending}>
            Save
          </Button>
        </div>
      </form>
      <form onSubmit={setPassword} noValidate className="grid gap-3 sm:grid-cols-3" aria-label="Password">
        <TextField label="New password" type="password" autoComplete="new-password" hint="Ends all of their sessions." error={password.formState.errors.password?.message} {...password.register('password')} />
        <div className="flex items-end">
          <Button type="submit" disabled={reset.isPending}>
            Set password
          </Button>
        </div>
        <div className="flex flex-wrap items-end justify-end gap-2">
          <Button
            variant={user.active ? 'danger' : 'secondary'}
            onClick={() =>
              update.mutate(
                { id: user.id, input: { active: !user.active } },
                { onSuccess: (u) => setMessage({ tone: 'good', text: u.active ? 'Reactivated.' : 'Deactivated: they can no longer sign in.' }), onError: (e) => fail(e.message) },
              )
            }
          >
            {user.active ? 'Deactivate' : 'Reactivate'}
          </Button>
          <Button variant="secondary" onClick={onClose}>
            Close
          </Button>
        </div>
      </form>
      <div aria-live="polite">{message && <Notice tone={message.tone}>{message.text}</Notice>}</div>
    </div>
  );
}
