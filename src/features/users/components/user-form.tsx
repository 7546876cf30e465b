import { useEffect, useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { CreateUserSchema, type CreateUserInput, type UserRow } from '@shared/contracts/users.ts';
import { ROLES, ROLE_LABELS } from '@shared/roles.ts';
import { TextField, SelectField, optionsOf } from '@/components/ui/field.tsx';
import { Button } from '@/components/ui/button.tsx';
import { Notice } from '@/components/ui/notice.tsx';
import { applyServerErrors } from '@/lib/form-errors.ts';
import { useCompanies } from '../api/get-companies.ts';
import { useCreateUser } from '../api/save-user.ts';
import { CompanyField } from './company-field.tsx';

const FIELDS = ['name', 'email', 'role', 'companyId', 'password'] as const;

export function NewUserForm({ onDone, onCancel }: { onDone: (u: UserRow) => void; onCancel: () => void }) {
  const { data: companies = [] } = useCompanies();
  const create = useCreateUser();
  const [problem, setProblem] = useState<string | null>(null);
  const form = useForm<CreateUserInput>({ resolver: zodResolver(CreateUserSchema), defaultValues: { role: 'installer', companyId: null } });
  // The form opens with the cursor in its first field.
  useEffect(() => form.setFocus('name'), [form]);

  const submit = form.handleSubmit((values) => {
    setProblem(null);
    create.mutate(values, {
      onSuccess: (u) => {
        form.reset();
        onDone(u);
      },
      onError: (e) => setProblem(applyServerErrors(e, form.setError, FIELDS)),
    });
  });
  const err = form.formState.errors;

  return (
    <form onSubmit={submit} noValidate className="grid gap-3 sm:grid-cols-2" aria-label="New user">
      <TextField label="Name" autoComplete="off" error={err.name?.message} {...form.register('name')} />
      <TextField label="E-mail" type="email" autoComplete="off" error={err.email?.message} {...form.register('email')} />
      <SelectField label="Role" error={err.role?.message} {...form.register('role')} options={optionsOf(ROLES, ROLE_LABELS)} />
      <CompanyField form={form} companies={companies} error={err.companyId?.message} />
      <TextField label="First password" type="password" autoComplete="new-password" hint="At least 10 characters. Tell the person to keep it private." error={err.password?.message} {...form.register('password')} />
      <div className="flex items-end gap-2">
        <Button type="submit" variant="primary" disabled={create.isPending}>
          {create.isPending ? 'Creating…' : 'Create user'}
        </Button>
        <Button variant="secondary" onClick={onCancel}>
          Cancel
        </Button>
      </div>
      {problem && (
        <div className="sm:col-span-2">
          <Notice tone="danger">{problem}</Notice>
        </div>
      )}
    </form>
  );
}
