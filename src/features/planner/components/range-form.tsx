import { useState } from 'react';
import { useForm, useWatch, type Resolver } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { RangeInputSchema, type RangeDetail, type RangeInput } from '@shared/contracts/stack-plans.ts';
import type { PlannerPart } from '@shared/domain/planner.ts';
import { Button } from '@/components/ui/button.tsx';
import { Card } from '@/components/ui/page.tsx';
import { SelectField, TextField } from '@/components/ui/field.tsx';
import { Notice } from '@/components/ui/notice.tsx';
import { applyServerErrors } from '@/lib/form-errors.ts';
import { formatNumber } from '@/lib/format.ts';
import type { InverterOption } from '../api/get-inverters.ts';
import { useUpdateRange } from '../api/update-range.ts';
import { formValuesOf, knownPaths, plainErrors, type RangeFormValues } from './range-form-values.ts';
import { RulesEditor } from './rules-editor.tsx';
import { RulesPreview } from './rules-preview.tsx';

interface RangeFormProps {
  detail: RangeDetail;
  inverters: InverterOption[];
  catalogue: Record<string, PlannerPart>;
  onSaved: (d: RangeDetail) => void;
}

const optionalNumber = (v: unknown) => (v === '' || v === null || v === undefined ? null : Number(v));

/** A range's definition and its BOM rules, with a live preview of what the rules would order. */
export function RangeForm({ detail, inverters, catalogue, onSaved }: RangeFormProps) {
  const update = useUpdateRange();
  const [problem, setProblem] = useState<string | null>(null);
  const [done, setDone] = useState(false);
  const form = useForm<RangeFormValues>({
    resolver: zodResolver(RangeInputSchema, { error: plainErrors }) as unknown as Resolver<RangeFormValues>,
    defaultValues: formValuesOf(detail),
  });
  const values = useWatch({ control: form.control }) as RangeFormValues;
  const err = form.formState.errors;
  const chosenInverters = values.inverterSkus ?? [];
  const controllers = Object.values(catalogue).filter((p) => p.category === 'controller');
  const modules = Object.values(catalogue).filter((p) => p.category === 'module');

  const submit = form.handleSubmit((parsed) => {
    setProblem(null);
    setDone(false);
    const input = parsed as unknown as RangeInput;
    update.mutate(
      { idOrCode: detail.code, input },
      {
        onSuccess: (saved) => {
          form.reset(formValuesOf(saved));
          setDone(true);
          onSaved(saved);
        },
        onError: (e) => setProblem(applyServerErrors(e, form.setError, knownPaths(values.rules.length)) ?? (e instanceof Error ? e.message : null)),
      },
    );
  }, () => setProblem('Some values need fixing: see the marked fields.'));

  const toggleInverter = (sku: string, on: boolean) =>
    form.setValue('inverterSkus', on ? [...chosenInverters, sku] : chosenInverters.filter((s) => s !== sku), { shouldDirty: true });

  return (
    <form onSubmit={submit} noValidate aria-label="Range" className="space-y-4">
      <datalist id="controller-skus">
        {controllers.map((p) => (
          <option key={p.sku} value={p.sku}>
            {p.name}
          </option>
        ))}
      </datalist>
      <datalist id="module-skus">
        {modules.map((p) => (
          <option key={p.sku} value={p.sku}>
            {p.name}
          </option>
        ))}
      </datalist>

      <Card>
        <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
          <TextField label="Name" className="lg:col-span-2" error={err.name?.message} {...form.register('name')} />
          <SelectField label="Connection" error={err.connection?.message} {...form.register('connection')}>
            <option value="series">Series (voltages add)</option>
            <option value="parallel">Parallel (capacities add)</option>
          </SelectField>
          <TextField label="Default depth of discharge (%)" type="number" mono min={10} max={100} hint="Used when a unit gives no usable kWh" error={err.defaultDodPct?.message} {...form.register('defaultDodPct', { setValueAs: optionalNumber })} />
          <TextField label="Controller SKU" list="controller-skus" mono error={err.controllerSku?.message} hint={catalogue[values.controllerSku?.toUpperCase()]?.name} {...form.register('controllerSku')} />
          <TextField label="Module SKU" list="module-skus" mono error={err.moduleSku?.message} hint={catalogue[values.moduleSku?.toUpperCase()]?.name} {...form.register('moduleSku')} />
          <TextField label="Feet and base height (mm)" type="number" mono min={0} error={err.baseHeightMm?.message} {...form.register('baseHeightMm', { valueAsNumber: true })} />
          <div className="grid grid-cols-3 gap-2">
            <TextField label="Min modules" type="number" mono min={1} error={err.minModules?.message} {...form.register('minModules', { valueAsNumber: true })} />
            <TextField label="Max modules" type="number" mono min={1} error={err.maxModules?.message} {...form.register('maxModules', { valueAsNumber: true })} />
            <TextField label="Max stacks" type="number" mono min={1} error={err.maxStacks?.message} {...form.register('maxStacks', { valueAsNumber: true })} />
          </div>
        </div>
        <fieldset className="mt-3">
          <legend className="mb-1 text-xs font-semibold text-ink-soft">Inverters listed for this range</legend>
          <div className="grid gap-x-4 gap-y-1 sm:grid-cols-2 lg:grid-cols-3">
            {inverters.map((i) => (
              <label key={i.sku} className="flex items-start gap-2 text-sm">
                <input type="checkbox" className="mt-1 accent-copper" checked={chosenInverters.includes(i.sku)} onChange={(e) => toggleInverter(i.sku, e.target.checked)} />
                <span>
                  {i.name} <span className="num text-xs text-ink-soft">{i.sku} · {formatNumber(i.batteryMinV)}–{formatNumber(i.batteryMaxV)} V</span>
                </span>
              </label>
            ))}
          </div>
        </fieldset>
      </Card>

      <RulesEditor control={form.control} register={form.register} setValue={form.setValue} errors={err} catalogue={catalogue} />

      <div className="flex flex-wrap items-center gap-3">
        <Button type="submit" variant="primary" disabled={update.isPending}>
          {update.isPending ? 'Saving…' : 'Save range'}
        </Button>
        <Button variant="ghost" onClick={() => { form.reset(formValuesOf(detail)); setProblem(null); setDone(false); }} disabled={!form.formState.isDirty}>
          Undo changes
        </Button>
        {form.formState.isDirty && !done && <span className="text-xs text-ink-soft">Unsaved changes</span>}
      </div>
      {problem && <Notice tone="danger">{problem}</Notice>}
      {done && !form.formState.isDirty && <Notice tone="good">Range saved. New plans use these rules from now on.</Notice>}

      <RulesPreview detail={detail} values={values} catalogue={catalogue} />
    </form>
  );
}
