import { useState } from 'react';
import { useFieldArray, useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { z } from 'zod';
import type { Job } from '@shared/contracts/jobs.ts';
import type { SavedPlan } from '@shared/contracts/stack-plans.ts';
import { Button } from '@/components/ui/button.tsx';
import { CustomerSelect, SelectField, TextField } from '@/components/ui/field.tsx';
import { Notice } from '@/components/ui/notice.tsx';
import { applyServerErrors } from '@/lib/form-errors.ts';
import { useCreateJob } from '../api/create-job.ts';

const FIELDS = ['reference', 'siteSuburb', 'sitePostcode', 'contact', 'notes', 'companyId', 'preferredWarehouse', 'planIds'] as const;

const formSchema = (needsCustomer: boolean) =>
  z
    .object({
      reference: z.string().trim().min(1, 'Give the job a reference (your order number or the site).').max(40, 'At most 40 characters.'),
      siteSuburb: z.string().trim().max(80),
      sitePostcode: z.string().trim().regex(/^(\d{4})?$/, 'An Australian postcode has 4 digits.'),
      contact: z.string().trim().max(120),
      notes: z.string().trim().max(2000),
      companyId: z.string(),
      preferredWarehouse: z.string(),
      planIds: z.array(z.string()),
      lines: z.array(z.object({ sku: z.string().trim().min(1, 'Give a SKU.'), qty: z.number({ error: 'Whole units.' }).int('Whole units.').min(1, 'At least 1.') })),
    })
    .refine((v) => !needsCustomer || v.companyId !== '', { path: ['companyId'], message: 'Choose the customer account this job is for.' })
    .refine((v) => v.planIds.length > 0 || v.lines.length > 0, { path: ['planIds'], message: 'Choose a saved plan or add a line by SKU.' });
type FormValues = z.infer<ReturnType<typeof formSchema>>;

interface NewJobFormProps {
  plans: SavedPlan[];
  customers: { id: string; name: string }[] | null;
  warehouses: { code: string; name: string }[] | null;
  initialPlanId?: string;
  onCreated: (job: Job) => void;
}

/** A job from saved plans and/or lines by SKU; staff choose the customer, installers order for their own company. */
export function NewJobForm({ plans, customers, warehouses, initialPlanId, onCreated }: NewJobFormProps) {
  const create = useCreateJob();
  const [problem, setProblem] = useState<string | null>(null);
  const initialPlan = plans.find((p) => p.id === initialPlanId);
  const form = useForm<FormValues>({
    resolver: zodResolver(formSchema(customers !== null)),
    defaultValues: {
      reference: '',
      siteSuburb: initialPlan?.siteSuburb ?? '',
      sitePostcode: initialPlan?.sitePostcode ?? '',
      contact: '',
      notes: '',
      companyId: initialPlan?.companyId ?? '',
      preferredWarehouse: '',
      planIds: initialPlan ? [initialPlan.id] : [],
      lines: [],
    },
  });
  const lines = useFieldArray({ control: form.control, name: 'lines' });
  const err = form.formState.errors;
  const companyId = form.watch('companyId');
  const choosable = customers === null ? plans : plans.filter((p) => p.companyId === companyId);

  const submit = form.handleSubmit((v) => {
    setProblem(null);
    create.mutate(
      {
        reference: v.reference,
        siteSuburb: v.siteSuburb || undefined,
        sitePostcode: v.sitePostcode || undefined,
        contact: v.contact || undefined,
        notes: v.notes || undefined,
        companyId: customers !== null ? v.companyId : undefined,
        preferredWarehouse: v.preferredWarehouse || undefined,
        planIds: v.planIds,
        lines: v.lines,
      },
      { onSuccess: onCreated, onError: (e) => setProblem(applyServerErrors(e, form.setError, FIELDS)) },
    );
  });

  return (
    <form onSubmit={submit} noValidate aria-label="New job" className="space-y-4">
      <div className="grid gap-3 rounded-lg border border-line bg-card p-4 sm:grid-cols-2 lg:grid-cols-3">
        <TextField label="Job reference" autoFocus placeholder="e.g. PO 4471 or 14 Fern St" error={err.reference?.message} {...form.register('reference')} />
        {customers !== null && (
          <CustomerSelect customers={customers} error={err.companyId?.message} {...form.register('companyId')} />
        )}
        {warehouses !== null && (
          <SelectField label="Preferred warehouse" error={err.preferredWarehouse?.message} hint="Reserved here first; others only when it is short." {...form.register('preferredWarehouse')}>
            <option value="">First by rank</option>
            {warehouses.map((w) => (
              <option key={w.code} value={w.code}>
                {w.name} ({w.code})
              </option>
            ))}
          </SelectField>
        )}
        <TextField label="Site suburb" error={err.siteSuburb?.message} {...form.register('siteSuburb')} />
        <TextField label="Site postcode" inputMode="numeric" maxLength={4} mono className="max-w-32" error={err.sitePostcode?.message} {...form.register('sitePostcode')} />
        <TextField label="Contact on site" error={err.contact?.message} {...form.register('contact')} />
        <TextField label="Notes" className="sm:col-span-2 lg:col-span-3" error={err.notes?.message} {...form.register('notes')} />
      </div>

      <fieldset className="rounded-lg border border-line bg-card p-4">
        <legend className="px-1 text-sm font-semibold">Saved plans</legend>
        {choosable.length === 0 ? (
          <p className="text-sm text-ink-soft">{customers !== null && !companyId ? 'Choose the customer to see their saved plans.' : 'No saved plans for this account yet.'}</p>
        ) : (
          <ul className="grid gap-1 sm:grid-cols-2">
            {choosable.map((p) => (
              <li key={p.id}>
                <label className="flex items-start gap-2 text-sm">
                  <input type="checkbox" value={p.id} className="mt-1" {...form.register('planIds')} />
                  <span>
                    <span className="font-semibold">{p.name}</span>
                    <span className="block text-xs text-ink-soft">
                      {p.rangeName} · {p.stacks} × {p.modulesPerStack} modules · {p.usableKwh} kWh usable
                    </span>
                  </span>
                </label>
              </li>
            ))}
          </ul>
        )}
        {err.planIds?.message && <p className="mt-2 text-xs font-medium text-danger">✕ {err.planIds.message}</p>}
      </fieldset>

      <fieldset className="rounded-lg border border-line bg-card p-4">
        <legend className="px-1 text-sm font-semibold">Extra lines by SKU</legend>
        <div className="space-y-2">
          {lines.fields.map((f, i) => (
            <div key={f.id} className="flex flex-wrap items-start gap-2">
              <TextField label="SKU" mono className="w-44" error={err.lines?.[i]?.sku?.message} {...form.register(`lines.${i}.sku`)} />
              <TextField label="Qty" type="number" min={1} step={1} mono className="w-24" error={err.lines?.[i]?.qty?.message} {...form.register(`lines.${i}.qty`, { valueAsNumber: true })} />
              <Button variant="ghost" className="mt-5" onClick={() => lines.remove(i)} aria-label={`Remove line ${i + 1}`}>
                Remove
              </Button>
            </div>
          ))}
          <Button onClick={() => lines.append({ sku: '', qty: 1 })}>+ Add a line</Button>
        </div>
      </fieldset>

      <div className="flex gap-2">
        <Button type="submit" variant="primary" disabled={create.isPending}>
          {create.isPending ? 'Creating…' : 'Create job'}
        </Button>
      </div>
      {problem && <Notice tone="danger">{problem}</Notice>}
    </form>
  );
}
