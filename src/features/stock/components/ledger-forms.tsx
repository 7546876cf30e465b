import { useState } from 'react';
import { Link } from 'react-router';
import { useFieldArray, useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { AdjustmentSchema, ReceiptSchema, TransferSchema, type AdjustmentInput, type LedgerResult, type ReceiptInput, type TransferInput } from '@shared/contracts/stock.ts';
import { Button } from '@/components/ui/button.tsx';
import { SelectField, TextAreaField, TextField } from '@/components/ui/field.tsx';
import { Notice } from '@/components/ui/notice.tsx';
import { paths } from '@/config/paths.ts';
import { applyServerErrors } from '@/lib/form-errors.ts';
import { useRecordMovement } from '../api/record-movement.ts';

type Warehouses = { code: string; name: string }[];
const box = 'grid gap-3 rounded-lg border border-line bg-card p-4 sm:grid-cols-2 lg:grid-cols-3';

function WarehouseSelect({ warehouses, label, error, ...rest }: { warehouses: Warehouses; label: string; error?: string } & React.SelectHTMLAttributes<HTMLSelectElement>) {
  return (
    <SelectField label={label} error={error} {...rest} options={warehouses.map((w) => ({ value: w.code, label: `${w.name} (${w.code})` }))}>
      <option value="">Choose…</option>
    </SelectField>
  );
}

/** What a ledger entry did, and which jobs its units completed. */
function Outcome({ result }: { result: LedgerResult }) {
  return (
    <Notice tone="good" title={`Booked as ${result.reference} (${result.movements} movement${result.movements === 1 ? '' : 's'})`}>
      {result.filledJobs.length > 0 ? (
        <ul className="mt-1 space-y-0.5">
          {result.filledJobs.map((j) => (
            <li key={j.id}>
              <Link to={paths.job.href(j.id)} className="font-semibold underline">
                {j.reference}
              </Link>{' '}
              ({j.company}) received {j.units} backordered unit{j.units === 1 ? '' : 's'} — {j.status === 'reserved' ? 'now fully reserved ✓' : 'still waiting for more'}
            </li>
          ))}
        </ul>
      ) : (
        <p>No job was waiting for these units.</p>
      )}
    </Notice>
  );
}

/** Serials as scanned or typed: one a line (or separated by spaces or commas); none → no serials. */
const splitSerials = (text: string) => {
  const serials = text.split(/[\s,]+/).filter(Boolean);
  return serials.length ? serials : undefined;
};
const serialError = (e: unknown) => {
  const x = e as ({ message?: string } & Record<number, { message?: string } | undefined>) | undefined;
  return x?.message ?? Object.values(x ?? {}).find((v): v is { message: string } => typeof (v as { message?: unknown })?.message === 'string')?.message;
};

export function ReceiptForm({ warehouses }: { warehouses: Warehouses }) {
  const record = useRecordMovement();
  const [result, setResult] = useState<LedgerResult | null>(null);
  const [problem, setProblem] = useState<string | null>(null);
  const form = useForm<ReceiptInput>({ resolver: zodResolver(ReceiptSchema), defaultValues: { warehouse: '', lines: [{ sku: '', bin: undefined, qty: 1 }] } });
  const lines = useFieldArray({ control: form.control, name: 'lines' });
  const err = form.formState.errors;
  const submit = form.handleSubmit((input) => {
    setProblem(null);
    setResult(null);
    record.mutate(
      { kind: 'receipts', input: { ...input, reference: input.reference || undefined, lines: input.lines.map((l) => ({ ...l, bin: l.bin || undefined })) } },
      {
        onSuccess: (r) => {
          setResult(r);
          form.reset({ warehouse: input.warehouse, lines: [{ sku: '', qty: 1 }] });
        },
        onError: (e) => setProblem(applyServerErrors(e, form.setError, ['warehouse', 'reference'])),
      },
    );
  });
  return (
    <form onSubmit={submit} noValidate aria-label="Receive goods" className="space-y-3">
      <div className={box}>
        <WarehouseSelect warehouses={warehouses} label="Into warehouse" error={err.warehouse?.message} {...form.register('warehouse')} />
        <TextField label="Delivery docket / reference" mono hint="Optional; the same docket cannot be booked twice." error={err.reference?.message} {...form.register('reference', { setValueAs: (v: string) => v || undefined })} />
      </div>
      <div className="space-y-2 rounded-lg border border-line bg-card p-4">
        {lines.fields.map((f, i) => (
          <div key={f.id} className="flex flex-wrap items-start gap-2">
            <TextField label="SKU" mono className="w-44" error={err.lines?.[i]?.sku?.message} {...form.register(`lines.${i}.sku`)} />
            <TextField label="Bin" mono className="w-28" hint="Blank: default bin" error={err.lines?.[i]?.bin?.message} {...form.register(`lines.${i}.bin`, { setValueAs: (v: string) => v || undefined })} />
            <TextField label="Qty" type="number" min={1} step={1} mono className="w-24" error={err.lines?.[i]?.qty?.message} {...form.register(`lines.${i}.qty`, { valueAsNumber: true })} />
            <TextAreaField
              label="Serials"
              mono
              rows={2}
              className="w-full sm:w-64"
              hint="Modules, controllers, inverters: one per unit, scanned or typed, a line each."
              error={serialError(err.lines?.[i]?.serials)}
              {...form.register(`lines.${i}.serials`, { setValueAs: (v: unknown) => (typeof v === 'string' ? splitSerials(v) : v) })}
            />
            {lines.fields.length > 1 && (
              <Button variant="ghost" className="mt-5" onClick={() => lines.remove(i)} aria-label={`Remove line ${i + 1}`}>
                Remove
              </Button>
            )}
          </div>
        ))}
        <Button onClick={() => lines.append({ sku: '', qty: 1 })}>+ Add a line</Button>
      </div>
      <Button type="submit" variant="primary" disabled={record.isPending}>
        {record.isPending ? 'Booking in…' : 'Book in'}
      </Button>
      {problem && <Notice tone="danger">{problem}</Notice>}
      {result && <Outcome result={result} />}
    </form>
  );
}

export function AdjustmentForm({ warehouses }: { warehouses: Warehouses }) {
  const record = useRecordMovement();
  const [result, setResult] = useState<LedgerResult | null>(null);
  const [problem, setProblem] = useState<string | null>(null);
  const form = useForm<AdjustmentInput>({ resolver: zodResolver(AdjustmentSchema), defaultValues: { sku: '', warehouse: '', reason: '' } });
  const err = form.formState.errors;
  const submit = form.handleSubmit((input) => {
    setProblem(null);
    setResult(null);
    record.mutate(
      { kind: 'adjustments', input },
      {
        onSuccess: (r) => {
          setResult(r);
          form.reset({ sku: '', warehouse: input.warehouse, reason: '' });
        },
        onError: (e) => setProblem(applyServerErrors(e, form.setError, ['sku', 'warehouse', 'bin', 'qty', 'reason'])),
      },
    );
  });
  return (
    <form onSubmit={submit} noValidate aria-label="Adjust stock" className="space-y-3">
      <div className={box}>
        <TextField label="SKU" mono error={err.sku?.message} {...form.register('sku')} />
        <WarehouseSelect warehouses={warehouses} label="Warehouse" error={err.warehouse?.message} {...form.register('warehouse')} />
        <TextField label="Bin" mono hint="Blank: default bin" error={err.bin?.message} {...form.register('bin', { setValueAs: (v: string) => v || undefined })} />
        <TextField label="Change (units)" type="number" step={1} mono hint="Negative to take stock off" error={err.qty?.message} {...form.register('qty', { valueAsNumber: true })} />
        <TextField label="Reason" className="sm:col-span-2" placeholder="e.g. Damaged in handling" error={err.reason?.message} {...form.register('reason')} />
      </div>
      <Button type="submit" variant="primary" disabled={record.isPending}>
        {record.isPending ? 'Saving…' : 'Adjust stock'}
      </Button>
      {problem && <Notice tone="danger">{problem}</Notice>}
      {result && <Notice tone="good">Adjusted: {result.reference}.</Notice>}
    </form>
  );
}

export function TransferForm({ warehouses }: { warehouses: Warehouses }) {
  const record = useRecordMovement();
  const [result, setResult] = useState<LedgerResult | null>(null);
  const [problem, setProblem] = useState<string | null>(null);
  const form = useForm<TransferInput>({ resolver: zodResolver(TransferSchema), defaultValues: { sku: '', fromWarehouse: '', toWarehouse: '' } });
  const err = form.formState.errors;
  const submit = form.handleSubmit((input) => {
    setProblem(null);
    setResult(null);
    record.mutate(
      { kind: 'transfers', input },
      { onSuccess: setResult, onError: (e) => setProblem(applyServerErrors(e, form.setError, ['sku', 'fromWarehouse', 'fromBin', 'toWarehouse', 'toBin', 'qty'])) },
    );
  });
  const optional = { setValueAs: (v: string) => v || undefined };
  return (
    <form onSubmit={submit} noValidate aria-label="Transfer stock" className="space-y-3">
      <div className={box}>
        <TextField label="SKU" mono error={err.sku?.message} {...form.register('sku')} />
        <TextField label="Units" type="number" min={1} step={1} mono error={err.qty?.message} {...form.register('qty', { valueAsNumber: true })} />
        <TextField label="Reason" error={err.reason?.message} {...form.register('reason', optional)} />
        <WarehouseSelect warehouses={warehouses} label="From warehouse" error={err.fromWarehouse?.message} {...form.register('fromWarehouse')} />
        <TextField label="From bin" mono hint="Blank: default bin" error={err.fromBin?.message} {...form.register('fromBin', optional)} />
        <span className="hidden lg:block" />
        <WarehouseSelect warehouses={warehouses} label="To warehouse" error={err.toWarehouse?.message} {...form.register('toWarehouse')} />
        <TextField label="To bin" mono hint="Blank: default bin" error={err.toBin?.message} {...form.register('toBin', optional)} />
      </div>
      <Button type="submit" variant="primary" disabled={record.isPending}>
        {record.isPending ? 'Moving…' : 'Transfer'}
      </Button>
      {problem && <Notice tone="danger">{problem}</Notice>}
      {result && <Outcome result={result} />}
    </form>
  );
}
