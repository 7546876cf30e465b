import { useState } from 'react';
import { Link } from 'react-router';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { StockLimitSchema, type PartStockSettings, type StockLimitInput, type Warehouse } from '@shared/contracts/stock.ts';
import { Button } from '@/components/ui/button.tsx';
import { SelectField, TextField } from '@/components/ui/field.tsx';
import { Notice } from '@/components/ui/notice.tsx';
import { paths } from '@/config/paths.ts';
import { applyServerErrors } from '@/lib/form-errors.ts';
import { usePartStockSettings, useSetDefaultBin, useSetStockLimits } from '../api/part-settings.ts';
import { useWarehouses } from '../api/get-warehouses.ts';

/**
 * A part's stock settings for staff: the minimum and maximum the low-stock view and reordering
 * work from, and the bin each warehouse picks it from first. Each is changed by the role that owns it.
 */
export function PartStockSettingsPanel({ sku, canSetLimits, canSetBins }: { sku: string; canSetLimits: boolean; canSetBins: boolean }) {
  const settings = usePartStockSettings(sku);
  const { data: warehouses = [] } = useWarehouses();
  if (settings.error) return <Notice tone="danger">{settings.error.message}</Notice>;
  if (!settings.data) return <p className="text-sm text-ink-soft">Loading the stock settings…</p>;
  const s = settings.data;
  return (
    <div className="space-y-4">
      <section aria-labelledby="limits-heading">
        <h3 id="limits-heading" className="text-sm font-semibold">
          Minimum and maximum
        </h3>
        <p className="mb-2 text-xs text-ink-soft">All warehouses together. At or below the minimum the part shows in low stock, with what brings it back to the maximum.</p>
        {canSetLimits ? <LimitsForm settings={s} /> : <p className="num text-sm">{s.limits ? `${s.limits.min} – ${s.limits.max}` : 'Not set'}</p>}
      </section>
      <section aria-labelledby="bins-heading">
        <h3 id="bins-heading" className="text-sm font-semibold">
          Default bin per warehouse
        </h3>
        <p className="mb-2 text-xs text-ink-soft">Reservations and picking take from this bin first, then the others in pick order.</p>
        <ul className="space-y-2">
          {warehouses.map((w) => (
            <li key={w.id}>
              <DefaultBinRow sku={s.sku} warehouse={w} current={s.defaultBins.find((d) => d.warehouse === w.code)?.bin ?? ''} editable={canSetBins} />
            </li>
          ))}
        </ul>
        <p className="mt-2 text-xs">
          <Link to={paths.stock.href(new URLSearchParams({ sku: s.sku }).toString())} className="text-copper underline">
            Levels per bin
          </Link>{' '}
          ·{' '}
          <Link to={paths.stockMovements.href(new URLSearchParams({ sku: s.sku }).toString())} className="text-copper underline">
            Movement history
          </Link>
        </p>
      </section>
    </div>
  );
}

function LimitsForm({ settings }: { settings: PartStockSettings }) {
  const save = useSetStockLimits();
  const [problem, setProblem] = useState<string | null>(null);
  const [saved, setSaved] = useState(false);
  const form = useForm<StockLimitInput>({ resolver: zodResolver(StockLimitSchema), defaultValues: settings.limits ?? { min: 0, max: 0 } });
  const err = form.formState.errors;
  const submit = form.handleSubmit((limits) => {
    setProblem(null);
    setSaved(false);
    save.mutate({ sku: settings.sku, limits }, { onSuccess: () => setSaved(true), onError: (e) => setProblem(applyServerErrors(e, form.setError, ['min', 'max'])) });
  });
  return (
    <form onSubmit={submit} noValidate aria-label="Minimum and maximum stock" className="flex flex-wrap items-start gap-2">
      <TextField label="Minimum" type="number" min={0} mono className="w-24" error={err.min?.message} {...form.register('min', { valueAsNumber: true })} />
      <TextField label="Maximum" type="number" min={0} mono className="w-24" error={err.max?.message} {...form.register('max', { valueAsNumber: true })} />
      <Button type="submit" className="mt-5" disabled={save.isPending}>
        Save levels
      </Button>
      {saved && (
        <p role="status" className="mt-6 text-sm text-teal">
          Saved ✓
        </p>
      )}
      {problem && <Notice tone="danger">{problem}</Notice>}
    </form>
  );
}

function DefaultBinRow({ sku, warehouse, current, editable }: { sku: string; warehouse: Warehouse; current: string; editable: boolean }) {
  const save = useSetDefaultBin();
  const label = `${warehouse.name} (${warehouse.code})`;
  if (!editable)
    return (
      <p className="text-sm">
        {label}: <span className="num font-semibold">{current || 'none'}</span>
      </p>
    );
  return (
    <div>
      <SelectField
        label={label}
        value={current}
        disabled={save.isPending || warehouse.bins.length === 0}
        onChange={(e) => e.target.value && save.mutate({ sku, warehouse: warehouse.code, bin: e.target.value })}
        options={warehouse.bins.map((b) => ({ value: b.code, label: `${b.code} (pick order ${b.pickOrder})` }))}
      >
        <option value="">{warehouse.bins.length ? 'No default bin' : 'This warehouse has no bins yet'}</option>
      </SelectField>
      {save.error && <Notice tone="danger">{save.error.message}</Notice>}
    </div>
  );
}
