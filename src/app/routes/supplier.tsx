import { useMemo, useState, type FormEvent } from 'react';
import { useParams } from 'react-router';
import type { ColumnDef } from '@tanstack/react-table';
import { NUMBER_LOCALES, NUMBER_LOCALE_LABELS, SupplierInputSchema, type Supplier, type SupplierPart } from '@shared/contracts/purchasing.ts';
import { Page, Card } from '@/components/ui/page.tsx';
import { Notice } from '@/components/ui/notice.tsx';
import { Button } from '@/components/ui/button.tsx';
import { SelectField, TextField, optionsOf } from '@/components/ui/field.tsx';
import { DataTable, PHONE_HIDDEN, ROW_ACTION } from '@/components/ui/data-table.tsx';
import { formatCost, formatNumber } from '@/lib/format.ts';
import { PurchasingTabs } from '@/features/purchasing/components/purchasing-tabs.tsx';
import { PriceHistory } from '@/features/purchasing/components/price-history.tsx';
import { usePriceHistory, useSaveSupplier, useSupplierParts, useSuppliers } from '@/features/purchasing/api/suppliers.ts';

/** One supplier: its terms, the parts it sells us, and the cost history of the part chosen. */
export function SupplierRoute() {
  const { id = '' } = useParams();
  const suppliers = useSuppliers();
  const supplier = suppliers.data?.find((s) => s.id === id);
  const parts = useSupplierParts(id);
  const [chosen, setChosen] = useState<string | null>(null);
  const history = usePriceHistory(id, chosen);
  const columns = useMemo<ColumnDef<SupplierPart>[]>(
    () => [
      { id: 'supplierSku', accessorKey: 'supplierSku', header: 'Supplier SKU', cell: (c) => (
        <>
          <button {...ROW_ACTION} type="button" onClick={() => setChosen(c.row.original.sku)} className="num text-left font-semibold text-copper-dark underline-offset-2 hover:underline break-all">{c.row.original.supplierSku}</button>
          <span className="block text-xs text-ink-soft">{c.row.original.sku} · {c.row.original.name}</span>
        </>
      ) },
      { id: 'pack', header: 'Pack / MOQ', meta: { align: 'right', className: PHONE_HIDDEN }, cell: (c) => <span className="num">{c.row.original.packSize} / {c.row.original.moq}</span> },
      { id: 'cost', header: 'Cost', meta: { align: 'right' }, cell: (c) => <span className="num">{c.row.original.costCents === null ? '—' : formatCost(c.row.original.costCents)}</span> },
      { id: 'breaks', header: 'Price breaks', meta: { className: PHONE_HIDDEN }, cell: (c) => (c.row.original.priceBreaks.length ? c.row.original.priceBreaks.map((b) => `${formatNumber(b.minQty)}+ ${formatCost(b.costCents)}`).join(' · ') : '—') },
      { id: 'lead', header: 'Lead', meta: { align: 'right', className: PHONE_HIDDEN }, cell: (c) => <span className="num">{c.row.original.leadTimeDays ?? '—'}</span> },
    ],
    [],
  );
  return (
    <Page title={supplier?.name ?? 'Supplier'} subtitle={supplier ? `${supplier.code} · ${supplier.parts} parts` : undefined}>
      <PurchasingTabs />
      {supplier && <TermsForm key={supplier.id} supplier={supplier} />}
      {chosen && (
        <Card className="mt-4">
          <h2 className="mb-2 text-sm font-semibold">Cost history of {chosen}</h2>
          {history.data && <PriceHistory entries={history.data} />}
        </Card>
      )}
      <h2 className="mb-2 mt-6 text-sm font-semibold">Parts this supplier sells us</h2>
      {parts.error && <Notice tone="danger">{parts.error.message}</Notice>}
      <DataTable label="Supplier parts" data={parts.data ?? []} columns={columns} getRowId={(p) => p.sku} dense empty={parts.isLoading ? 'Loading…' : 'No parts yet: import a price list.'} />
    </Page>
  );
}

function TermsForm({ supplier }: { supplier: Supplier }) {
  const save = useSaveSupplier();
  const [v, setV] = useState({ ...supplier, contactName: supplier.contactName ?? '', contactEmail: supplier.contactEmail ?? '', contactPhone: supplier.contactPhone ?? '' });
  const [errors, setErrors] = useState<Record<string, string>>({});
  const set = (k: keyof typeof v) => (e: { target: { value: string } }) => setV((s) => ({ ...s, [k]: e.target.value }));
  const submit = (e: FormEvent) => {
    e.preventDefault();
    const parsed = SupplierInputSchema.safeParse({ code: v.code, name: v.name, currency: v.currency, audPerUnit: Number(v.audPerUnit), numberLocale: v.numberLocale, leadTimeDays: Number(v.leadTimeDays), contactName: v.contactName || null, contactEmail: v.contactEmail || null, contactPhone: v.contactPhone || null, flagChangePct: Number(v.flagChangePct) });
    if (!parsed.success) return setErrors(Object.fromEntries(parsed.error.issues.map((i) => [String(i.path[0]), i.message])));
    setErrors({});
    save.mutate({ id: supplier.id, input: parsed.data });
  };
  return (
    <Card>
      <h2 className="mb-3 text-sm font-semibold">Terms</h2>
      <form onSubmit={submit} className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
        <TextField label="Name" value={v.name} onChange={set('name')} error={errors.name} />
        <TextField label="Currency" mono value={v.currency} onChange={set('currency')} error={errors.currency} />
        <TextField label="AUD per 1 unit of its currency" mono inputMode="decimal" value={String(v.audPerUnit)} onChange={set('audPerUnit')} error={errors.audPerUnit} />
        <SelectField label="How its files write numbers" value={v.numberLocale} onChange={set('numberLocale')} options={optionsOf(NUMBER_LOCALES, NUMBER_LOCALE_LABELS)} />
        <TextField label="Lead time (days)" mono inputMode="numeric" value={String(v.leadTimeDays)} onChange={set('leadTimeDays')} error={errors.leadTimeDays} />
        <TextField label="Flag cost changes above (%)" mono inputMode="decimal" value={String(v.flagChangePct)} onChange={set('flagChangePct')} error={errors.flagChangePct} />
        <TextField label="Contact" value={v.contactName} onChange={set('contactName')} />
        <TextField label="Orders e-mail" type="email" value={v.contactEmail} onChange={set('contactEmail')} error={errors.contactEmail} />
        <div className="flex items-center gap-3 sm:col-span-2 lg:col-span-4">
          <Button type="submit" variant="primary" disabled={save.isPending}>Save terms</Button>
          {save.isSuccess && <span className="text-sm text-teal">Saved.</span>}
          {save.error && <span className="text-sm text-danger">{save.error.message}</span>}
        </div>
      </form>
    </Card>
  );
}
