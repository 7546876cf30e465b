import { useState } from 'react';
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

const FIELDS = ['name', 'email', 'role', 'companyId', 'password'] as const;

export function NewUserForm({ onDone }: { onDone: (u: UserRow) => void }) {
  const { data: companies = [] } = useCompanies();
  const create = useCreateUser();
  const [problem, setProblem] = useState<string | null>(null);
  const form = useForm<CreateUserInput>({ resolver: zodResolver(CreateUserSchema), defaultValues: { role: 'installer', companyId: null } });
  const role = form.watch('role');
  const choices = companies.filter((c) => (role === 'installer' ? c.kind === 'installer' : c.kind === 'wholesaler'));

  const submit = form.handleSubmit((values) => {
    setProblem(null);
    const input = { ...values, companyId: values.companyId || null };
    create.mutate(input, {
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
      <TextField label="Name" error={err.name?.message} {...form.register('name')} />
      <TextField label="E-mail" type="email" error={err.email?.message} {...form.register('email')} />
      <SelectField label="Role" error={err.role?.message} {...form.register('role')} options={optionsOf(ROLES, ROLE_LABELS)} />
      <SelectField label="Company" error={err.companyId?.message} {...form.register('companyId')}>
        <option value="">{role === 'installer' ? 'Choose a customer company…' : 'The wholesaler'}</option>
        {choices.map((c) => (
          <option key={c.id} value={c.id}>
            {c.name}
          </option>
        ))}
      </SelectField>
      <TextField label="First password" type="password" autoComplete="new-password" hint="At least 10 characters. Tell the person to keep it private." error={err.password?.message} {...form.register('password')} />
      <div className="flex items-end">
        <Button type="submit" variant="primary" disabled={create.isPending}>
          {create.isPending ? 'Creating…' : 'Create user'}
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
