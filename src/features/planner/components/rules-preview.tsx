import { useMemo, useState } from 'react';
import type { RangeDetail } from '@shared/contracts/stack-plans.ts';
import { BomRuleSchema, type BomRule } from '@shared/domain/bom-rules.ts';
import { planStack, type PlannerPart, type PlannerRange, type StackPlan } from '@shared/domain/planner.ts';
import { Notice } from '@/components/ui/notice.tsx';
import type { SiteInput } from '@shared/domain/site.ts';
import { formatNumber } from '@/lib/format.ts';
import { plannerRangeOf } from '../lib/plan-view.ts';
import type { RangeFormValues } from './range-form-values.ts';

const whole = (n: unknown): n is number => typeof n === 'number' && Number.isInteger(n);

/** Sites to preview the rules on, so rules that depend on the site can be seen to fire. */
const PREVIEW_SITES: { label: string; site: SiteInput }[] = [
  { label: 'Default site (3 m run, stud wall, indoors)', site: {} },
  { label: 'Garage, masonry wall, 8 m run', site: { location: 'garage', wall: 'masonry', cableRunM: 8 } },
  { label: 'Outdoors under cover, 4 m run', site: { location: 'outdoor', cableRunM: 4 } },
  { label: 'New Zealand, wall shared with a habitable room', site: { country: 'NZ', sharesHabitableWall: true } },
];
/** Enough columns for any real range without letting a typo build a thousand. */
const MAX_COLUMNS = 24;

interface RulesPreviewProps {
  detail: RangeDetail;
  values: RangeFormValues;
  /** Catalogue parts by SKU, so a rule for a part new to this range can be previewed before saving. */
  catalogue: Record<string, PlannerPart>;
}

/** The BOM at every module count, from the edited (unsaved) values, with the shared planner. */
export function RulesPreview({ detail, values, catalogue }: RulesPreviewProps) {
  const [stacks, setStacks] = useState(1);
  const [siteIndex, setSiteIndex] = useState(0);
  const site = PREVIEW_SITES[siteIndex]!.site;
  const saved = plannerRangeOf(detail);
  const { rules, left } = useMemo(() => {
    const ok: BomRule[] = [];
    const out: number[] = [];
    values.rules.forEach((r, i) => {
      const parsed = BomRuleSchema.safeParse(r);
      if (parsed.success) ok.push(parsed.data);
      else out.push(i + 1);
    });
    return { rules: ok, left: out };
  }, [values.rules]);

  const min = whole(values.minModules) && values.minModules >= 1 ? values.minModules : saved.minModules;
  const max = whole(values.maxModules) && values.maxModules >= min ? Math.min(values.maxModules, min + MAX_COLUMNS - 1) : min;
  const maxStacks = whole(values.maxStacks) && values.maxStacks >= 1 ? values.maxStacks : saved.maxStacks;
  const shownStacks = Math.min(stacks, maxStacks);

  const columns = useMemo(() => {
    const range: PlannerRange = {
      ...saved,
      name: values.name || saved.name,
      connection: values.connection,
      minModules: min,
      maxModules: max,
      maxStacks,
      baseHeightMm: whole(values.baseHeightMm) ? values.baseHeightMm : saved.baseHeightMm,
      defaultDodPct: typeof values.defaultDodPct === 'number' && Number.isFinite(values.defaultDodPct) ? values.defaultDodPct : null,
      rules,
    };
    const parts = { ...catalogue, ...detail.planner.parts };
    return Array.from({ length: max - min + 1 }, (_, i) => {
      const modules = min + i;
      return { modules, result: planStack({ range, parts, modules, stacks: shownStacks, site }) };
    });
  }, [saved, values.name, values.connection, values.baseHeightMm, values.defaultDodPct, min, max, maxStacks, rules, catalogue, detail.planner.parts, shownStacks, site]);

  const plans = columns.filter((c): c is { modules: number; result: { ok: true; plan: StackPlan } } => c.result.ok);
  const errors = [...new Set(columns.flatMap((c) => (c.result.ok ? [] : [c.result.error.message])))];
  const skus: { sku: string; name: string }[] = [];
  for (const { result } of plans) for (const l of result.plan.bom) if (!skus.some((s) => s.sku === l.sku)) skus.push({ sku: l.sku, name: l.name });
  const qty = (modules: number, sku: string) => plans.find((p) => p.modules === modules)?.result.plan.bom.find((l) => l.sku === sku)?.qtyUnits;
  const unitsChanged = values.controllerSku.toUpperCase() !== detail.controllerSku || values.moduleSku.toUpperCase() !== detail.moduleSku;

  return (
    <section aria-labelledby="preview-heading" className="space-y-2">
      <div className="flex flex-wrap items-end justify-between gap-2">
        <div>
          <h2 id="preview-heading" className="text-base font-semibold">
            Preview: the BOM at each module count
          </h2>
          <p className="text-xs text-ink-soft">From the values above, not yet saved. Quantities are units ordered, after rounding up to packs.</p>
        </div>
        <div className="flex flex-wrap items-end gap-3">
          <label className="text-xs font-semibold text-ink-soft">
            Site{' '}
            <select value={siteIndex} onChange={(e) => setSiteIndex(Number(e.target.value))} className="ml-1 rounded-md border border-line bg-card px-2 py-1 text-sm text-ink">
              {PREVIEW_SITES.map((s, i) => (
                <option key={s.label} value={i}>
                  {s.label}
                </option>
              ))}
            </select>
          </label>
          {maxStacks > 1 && (
            <label className="text-xs font-semibold text-ink-soft">
              Stacks{' '}
              <select value={shownStacks} onChange={(e) => setStacks(Number(e.target.value))} className="num ml-1 rounded-md border border-line bg-card px-2 py-1 text-sm text-ink">
                {Array.from({ length: maxStacks }, (_, i) => (
                  <option key={i + 1} value={i + 1}>
                    {i + 1}
                  </option>
                ))}
              </select>
            </label>
          )}
        </div>
      </div>
      {unitsChanged && <Notice>The preview uses the saved controller and module ({detail.controllerSku}, {detail.moduleSku}) until you save the new ones.</Notice>}
      {left.length > 0 && <Notice tone="caution">Left out of the preview until complete: rule {left.join(', ')}.</Notice>}
      {errors.map((e) => (
        <Notice key={e} tone="danger" title="The planner refuses this range">
          <p data-testid="preview-error">{e}</p>
        </Notice>
      ))}
      {plans.length > 0 && (
        <div className="overflow-auto rounded-lg border border-line bg-card">
          <table className="w-full border-collapse text-sm" aria-label="BOM preview by module count">
            <thead className="bg-[#efece4]">
              <tr>
                <th scope="col" className="border-b border-line px-3 py-1.5 text-left text-xs font-semibold uppercase tracking-wide text-ink-soft">
                  Modules per stack
                </th>
                {plans.map((p) => (
                  <th key={p.modules} scope="col" className="num border-b border-line px-2 py-1.5 text-right text-xs font-semibold">
                    {p.modules}
                  </th>
                ))}
              </tr>
            </thead>
            <tbody>
              <tr className="border-b border-line/70 text-xs text-ink-soft">
                <th scope="row" className="px-3 py-1 text-left font-medium">
                  DC class / height (mm)
                </th>
                {plans.map((p) => (
                  <td key={p.modules} className="num px-2 py-1 text-right whitespace-nowrap">
                    {p.result.plan.dvc} · {formatNumber(p.result.plan.heightMm)}
                  </td>
                ))}
              </tr>
              {skus.map((s) => (
                <tr key={s.sku} className="border-b border-line/70 last:border-0">
                  <th scope="row" className="px-3 py-1 text-left font-normal">
                    <span className="num font-semibold">{s.sku}</span> <span className="text-xs text-ink-soft">{s.name}</span>
                  </th>
                  {plans.map((p) => {
                    const q = qty(p.modules, s.sku);
                    return (
                      <td key={p.modules} className={`num px-2 py-1 text-right ${q === undefined ? 'text-ink-soft/60' : ''}`}>
                        {q === undefined ? '–' : formatNumber(q)}
                      </td>
                    );
                  })}
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </section>
  );
}
