import { useId } from 'react';
import type { RangeDetail } from '@shared/contracts/stack-plans.ts';
import { SelectField, TextField, optionsOf } from '@/components/ui/field.tsx';
import { COUNTRIES, COUNTRY_LABELS, DEFAULT_SITE, FLOORS, FLOOR_LABELS, LOCATIONS, LOCATION_LABELS, WALLS, WALL_LABELS } from '@shared/domain/site.ts';
import { Stepper } from '@/components/ui/stepper.tsx';
import { formatNumber } from '@/lib/format.ts';
import type { InverterOption } from '../api/get-inverters.ts';
import type { PlanMode, PlannerParams } from '../hooks/use-planner-params.ts';

export function inverterWindow(i: Pick<InverterOption, 'batteryMinV' | 'batteryMaxV' | 'batteryInputs' | 'parallelStacks' | 'maxBatteryKwh'>) {
  const stacks = i.parallelStacks != null ? ` (${i.parallelStacks} stack${i.parallelStacks === 1 ? '' : 's'} in parallel)` : '';
  const inputs = `${i.batteryInputs} input${i.batteryInputs === 1 ? '' : 's'}${stacks}`;
  const kwh = i.maxBatteryKwh != null ? `, up to ${formatNumber(i.maxBatteryKwh)} kWh` : '';
  return `${formatNumber(i.batteryMinV)}–${formatNumber(i.batteryMaxV)} V, ${inputs}${kwh}`;
}

const MODES: { value: PlanMode; label: string }[] = [
  { value: 'modules', label: 'Module count' },
  { value: 'target', label: 'Target usable kWh' },
];

interface PlanControlsProps {
  range: RangeDetail;
  params: PlannerParams;
  update: (patch: Partial<PlannerParams>) => void;
  inverters: InverterOption[];
}

/** What to plan: a module count (and stacks) or a usable-energy target, and optionally the inverter. */
export function PlanControls({ range, params, update, inverters }: PlanControlsProps) {
  const modeName = useId();
  const listed = new Set(range.inverterSkus);
  const forRange = inverters.filter((i) => listed.has(i.sku));
  const others = inverters.filter((i) => !listed.has(i.sku));
  const chosen = inverters.find((i) => i.sku === params.inverter) ?? null;
  const option = (i: InverterOption) => (
    <option key={i.sku} value={i.sku}>
      {`${i.name} (${i.sku}) — ${formatNumber(i.batteryMinV)}–${formatNumber(i.batteryMaxV)} V${i.lifecycle !== 'active' ? ` · ${i.lifecycle}` : ''}`}
    </option>
  );

  return (
    <div className="flex flex-wrap items-start gap-x-6 gap-y-3">
      <fieldset>
        <legend className="mb-1 block text-xs font-semibold text-ink-soft">Plan by</legend>
        <div className="inline-flex rounded-md border border-line bg-card p-0.5">
          {MODES.map((m) => (
            <label key={m.value} className={`cursor-pointer rounded px-3 py-1 text-sm has-[:focus-visible]:outline-3 has-[:focus-visible]:outline-copper ${params.mode === m.value ? 'bg-ink font-semibold text-paper' : 'text-ink hover:bg-paper'}`}>
              <input type="radio" name={modeName} value={m.value} checked={params.mode === m.value} onChange={() => update({ mode: m.value })} className="sr-only" />
              {m.label}
            </label>
          ))}
        </div>
      </fieldset>

      {params.mode === 'modules' ? (
        <>
          <Stepper
            label="Modules per stack"
            value={params.modules}
            onChange={(modules) => update({ modules })}
            min={range.minModules}
            max={range.maxModules}
            hint={`${range.minModules}–${range.maxModules} for this range`}
            lessLabel="One module fewer"
            moreLabel="One module more"
          />
          {range.maxStacks > 1 && (
            <Stepper
              label="Stacks in parallel"
              value={params.stacks}
              onChange={(stacks) => update({ stacks })}
              min={1}
              max={range.maxStacks}
              hint={`1–${range.maxStacks}`}
              lessLabel="One stack fewer"
              moreLabel="One stack more"
            />
          )}
        </>
      ) : (
        <TextField
          label="Target usable energy (kWh)"
          // Text, not a number box: a number box reports "20." as empty mid-typing.
          type="text"
          inputMode="decimal"
          autoComplete="off"
          mono
          className="w-48"
          value={params.kwh}
          onChange={(e) => update({ kwh: e.target.value })}
          hint="The fewest stacks, then modules, that reach it"
        />
      )}

      <SelectField
        label="Inverter (optional)"
        className="min-w-72 max-w-xl flex-1"
        value={params.inverter ?? ''}
        onChange={(e) => update({ inverter: e.target.value || null })}
        hint={chosen ? <>Battery window <span className="num">{inverterWindow(chosen)}</span></> : 'Checks the battery voltage window and inputs'}
      >
        <option value="">No inverter</option>
        {forRange.length > 0 && <optgroup label="Listed for this range">{forRange.map(option)}</optgroup>}
        {others.length > 0 && <optgroup label="Other inverters">{others.map(option)}</optgroup>}
      </SelectField>
      <label className={`mt-5 flex items-center gap-2 text-sm ${params.inverter ? '' : 'text-ink-soft'}`}>
        <input type="checkbox" checked={params.includeInverter && !!params.inverter} disabled={!params.inverter} onChange={(e) => update({ includeInverter: e.target.checked })} className="h-4 w-4 accent-copper" />
        Include the inverter on the BOM
      </label>

      <SiteControls params={params} update={update} />
    </div>
  );
}

interface SiteSelectProps<T extends string> {
  label: string;
  value: string;
  onChange: (value: string) => void;
  /** What the planner assumes when nothing is chosen. */
  assumed: string;
  values: readonly T[];
  labels: Record<T, string>;
}

/** One site choice; the empty option says what the planner assumes. */
function SiteSelect<T extends string>({ label, value, onChange, assumed, values, labels }: SiteSelectProps<T>) {
  return (
    <SelectField label={label} value={value} onChange={(e) => onChange(e.target.value)} options={optionsOf(values, labels)}>
      <option value="">Not said ({assumed})</option>
    </SelectField>
  );
}

/** The site: what decides cable lengths, fixings, protection and which cautions apply. */
function SiteControls({ params, update }: Pick<PlanControlsProps, 'params' | 'update'>) {
  return (
    <fieldset className="w-full border-t border-line pt-3">
      <legend className="float-left mb-2 w-full text-xs font-semibold uppercase tracking-wide text-ink-soft">Site</legend>
      <div className="clear-both grid grid-cols-1 gap-x-4 gap-y-3 sm:grid-cols-2 lg:grid-cols-3">
        <TextField
          label="Cable run to inverter (m)"
          type="text"
          inputMode="decimal"
          autoComplete="off"
          mono
          placeholder={String(DEFAULT_SITE.cableRunM)}
          value={params.run}
          onChange={(e) => update({ run: e.target.value })}
          hint="Battery to inverter, one way"
        />
        <SiteSelect label="Wall" value={params.wall} onChange={(wall) => update({ wall })} assumed={WALL_LABELS[DEFAULT_SITE.wall]} values={WALLS} labels={WALL_LABELS} />
        <SiteSelect label="Location" value={params.location} onChange={(location) => update({ location })} assumed={LOCATION_LABELS[DEFAULT_SITE.location]} values={LOCATIONS} labels={LOCATION_LABELS} />
        <SiteSelect label="Wall backs onto a habitable room" value={params.sharedWall} onChange={(sharedWall) => update({ sharedWall })} assumed="no" values={['no', 'yes'] as const} labels={{ no: 'No', yes: 'Yes' }} />
        <SiteSelect label="Floor" value={params.floor} onChange={(floor) => update({ floor })} assumed={FLOOR_LABELS[DEFAULT_SITE.floor]} values={FLOORS} labels={FLOOR_LABELS} />
        <SiteSelect label="Country" value={params.country} onChange={(country) => update({ country })} assumed={COUNTRY_LABELS[DEFAULT_SITE.country]} values={COUNTRIES} labels={COUNTRY_LABELS} />
      </div>
    </fieldset>
  );
}
