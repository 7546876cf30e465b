import { useEffect } from 'react';
import type { FieldValues, Path, PathValue, UseFormReturn } from 'react-hook-form';
import type { CompanyOption } from '@shared/contracts/users.ts';
import { companyKindOf, type Role } from '@shared/roles.ts';
import { SelectField, TextField } from '@/components/ui/field.tsx';

type WithAccess = FieldValues & { role: Role; companyId?: string | null };

/**
 * Keeps a user form's company in step with its role: a staff role belongs to the wholesaler
 * itself, so the form picks it; an installer role offers only customer companies (and drops
 * a company that is not one).
 */
export function useCompanyFollowsRole<T extends WithAccess>(form: UseFormReturn<T>, companies: CompanyOption[]) {
  const role = form.watch('role' as Path<T>) as Role;
  const companyId = (form.watch('companyId' as Path<T>) as string | null | undefined) ?? null;
  const kind = companyKindOf(role);
  const wholesaler = companies.find((c) => c.kind === 'wholesaler') ?? null;
  useEffect(() => {
    const current = companies.find((c) => c.id === companyId);
    const next = kind === 'wholesaler' ? (wholesaler?.id ?? null) : current?.kind === 'installer' ? current.id : null;
    if (companies.length && next !== companyId) form.setValue('companyId' as Path<T>, next as PathValue<T, Path<T>>, { shouldDirty: true });
  }, [kind, companies, companyId, wholesaler, form]);
  return { kind, wholesaler, customers: companies.filter((c) => c.kind === 'installer') };
}

/** The company a user belongs to: fixed to the wholesaler for staff, a choice of customer companies for installers. */
export function CompanyField<T extends WithAccess>({ form, companies, error }: { form: UseFormReturn<T>; companies: CompanyOption[]; error?: string }) {
  const { kind, wholesaler, customers } = useCompanyFollowsRole(form, companies);
  if (kind === 'wholesaler') return <TextField label="Company" value={wholesaler?.name ?? 'The wholesaler'} readOnly hint="Staff roles belong to the wholesaler." error={error} />;
  return (
    <SelectField label="Company" error={error} {...form.register('companyId' as Path<T>, { setValueAs: (v: string) => v || null })}>
      <option value="" disabled>
        Choose a customer company…
      </option>
      {customers.map((c) => (
        <option key={c.id} value={c.id}>
          {c.name}
        </option>
      ))}
    </SelectField>
  );
}
