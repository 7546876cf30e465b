import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { z } from 'zod';
import type { SavedPlan, StackPlanRequest } from '@shared/contracts/stack-plans.ts';
import { Button } from '@/components/ui/button.tsx';
import { CustomerSelect, TextField } from '@/components/ui/field.tsx';
import { Notice } from '@/components/ui/notice.tsx';
import { applyServerErrors } from '@/lib/form-errors.ts';
import { useCustomers } from '../api/get-customers.ts';
import { useSavePlan } from '../api/save-plan.ts';

const FIELDS = ['name', 'siteSuburb', 'sitePostcode', 'companyId'] as const;

const formSchema = (needsCustomer: boolean) =>
  z
    .object({
      name: z.string().trim().min(1, 'Name the plan (a site or customer reference).').max(120, 'At most 120 characters.'),
      siteSuburb: z.string().trim().max(80, 'At most 80 characters.'),
      sitePostcode: z.string().trim().regex(/^(\d{4})?$/, 'An Australian postcode has 4 digits.'),
      companyId: z.string(),
    })
    .refine((v) => !needsCustomer || v.companyId !== '', { path: ['companyId'], message: 'Choose the customer account this plan is for.' });
type FormValues = z.infer<ReturnType<typeof formSchema>>;

interface SavePlanFormProps {
  request: StackPlanRequest;
  /** Staff save plans for a customer account; installers for their own company. */
  forCustomer: boolean;
  ownCompany?: string | null;
  onSaved: (plan: SavedPlan) => void;
  onCancel: () => void;
}

export function SavePlanForm({ request, forCustomer, ownCompany, onSaved, onCancel }: SavePlanFormProps) {
  const { data: customers = [] } = useCustomers(forCustomer);
  const save = useSavePlan();
  const [problem, setProblem] = useState<string | null>(null);
  const form = useForm<FormValues>({ resolver: zodResolver(formSchema(forCustomer)), defaultValues: { name: '', siteSuburb: '', sitePostcode: '', companyId: '' } });
  const err = form.formState.errors;

  const submit = form.handleSubmit((v) => {
    setProblem(null);
    save.mutate(
      {
        name: v.name,
        siteSuburb: v.siteSuburb || undefined,
        sitePostcode: v.sitePostcode || undefined,
        companyId: forCustomer ? v.companyId : undefined,
        request,
      },
      { onSuccess: onSaved, onError: (e) => setProblem(applyServerErrors(e, form.setError, FIELDS)) },
    );
  });

  return (
    <form onSubmit={submit} noValidate aria-label="Save plan as draft" className="no-print grid gap-3 rounded-lg border border-line bg-card p-4 sm:grid-cols-2 lg:grid-cols-4">
      <TextField label="Plan name" autoFocus placeholder="e.g. Nguyen, garage wall" error={err.name?.message} {...form.register('name')} />
      <TextField label="Site suburb" error={err.siteSuburb?.message} {...form.register('siteSuburb')} />
      <TextField label="Site postcode" inputMode="numeric" maxLength={4} mono className="max-w-32" error={err.sitePostcode?.message} {...form.register('sitePostcode')} />
      {forCustomer ? (
        <CustomerSelect customers={customers} error={err.companyId?.message} {...form.register('companyId')} />
      ) : (
        <p className="self-end pb-1.5 text-sm text-ink-soft">Saved for {ownCompany ?? 'your company'}.</p>
      )}
      <div className="flex gap-2 sm:col-span-2 lg:col-span-4">
        <Button type="submit" variant="primary" disabled={save.isPending}>
          {save.isPending ? 'Saving…' : 'Save draft'}
        </Button>
        <Button variant="ghost" onClick={onCancel}>
          Cancel
        </Button>
      </div>
      {problem && (
        <div className="sm:col-span-2 lg:col-span-4">
          <Notice tone="danger">{problem}</Notice>
        </div>
      )}
    </form>
  );
}
