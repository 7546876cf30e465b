import { useId } from 'react';
import type { Facets, Maker, RangeSummary } from '@shared/contracts/parts.ts';
import { LIFECYCLES, LIFECYCLE_LABELS } from '@shared/contracts/parts.ts';
import { CATEGORY_CODES, CATEGORY_LABELS } from '@shared/contracts/part-attributes.ts';
import { formatNumber } from '@/lib/format.ts';
import type { PartFilters } from '../api/get-parts.ts';
import type { FilterKey } from '../hooks/use-catalogue-params.ts';

export interface FacetOption {
  value: string;
  label: string;
  count: number;
}

const IN_STOCK_LABELS: Record<string, string> = { true: 'In stock', false: 'None available' };

function ordered(counts: Record<string, number> | undefined, order: readonly string[], label: (v: string) => string): FacetOption[] {
  const c = counts ?? {};
  const known = order.filter((v) => v in c);
  const rest = Object.keys(c)
    .filter((v) => !order.includes(v))
    .sort((a, b) => label(a).localeCompare(label(b)));
  return [...known, ...rest].map((value) => ({ value, label: label(value), count: c[value] ?? 0 }));
}

/** Labels for each filter's values, from the contracts, /makers and /ranges. */
export function facetLabeller(makers: Maker[], ranges: RangeSummary[]) {
  const makerNames = new Map(makers.map((m) => [m.code, m.name]));
  const rangeNames = new Map(ranges.map((r) => [r.code, r.name]));
  return (key: FilterKey, value: string): string => {
    switch (key) {
      case 'category':
        return CATEGORY_LABELS[value as keyof typeof CATEGORY_LABELS] ?? value;
      case 'maker':
        return makerNames.get(value) ?? value;
      case 'range':
        return rangeNames.get(value) ?? value;
      case 'lifecycle':
        return LIFECYCLE_LABELS[value as keyof typeof LIFECYCLE_LABELS] ?? value;
      case 'inStock':
        return IN_STOCK_LABELS[value] ?? value;
    }
  };
}

const GROUPS: { key: FilterKey; title: string }[] = [
  { key: 'category', title: 'Category' },
  { key: 'maker', title: 'Maker' },
  { key: 'range', title: 'Range' },
  { key: 'lifecycle', title: 'Lifecycle' },
  { key: 'inStock', title: 'Availability' },
];

/** Left-hand filters: each value with how many parts it would show. Picking the chosen value again clears it. */
export function FacetPanel({
  facets,
  filters,
  label,
  onPick,
}: {
  facets: Facets | undefined;
  filters: PartFilters;
  label: (key: FilterKey, value: string) => string;
  onPick: (key: FilterKey, value: string | undefined) => void;
}) {
  const orders: Record<FilterKey, readonly string[]> = { category: CATEGORY_CODES, maker: [], range: [], lifecycle: LIFECYCLES, inStock: ['true', 'false'] };
  const groups = GROUPS.map(({ key, title }) => {
    const selected = filters[key] as string | undefined;
    let options = ordered(facets?.[key], orders[key], (v) => label(key, v));
    if (selected && !options.some((o) => o.value === selected)) options = [{ value: selected, label: label(key, selected), count: 0 }, ...options];
    return { key, title, selected, options };
  }).filter((g) => g.options.length > 0);
  return (
    <nav aria-label="Filters" className="space-y-4">
      {groups.map(({ key, title, selected, options }) => (
        <FacetGroup key={key} title={title} options={options} selected={selected} onPick={(v) => onPick(key, v)} />
      ))}
      {facets && groups.length === 0 && <p className="text-xs text-ink-soft">Filters appear here when the search finds parts.</p>}
    </nav>
  );
}

function FacetGroup({ title, options, selected, onPick }: { title: string; options: FacetOption[]; selected?: string; onPick: (v: string | undefined) => void }) {
  const id = useId();
  return (
    <section aria-labelledby={id}>
      <div className="mb-1 flex items-baseline justify-between">
        <h2 id={id} className="text-xs font-semibold uppercase tracking-wide text-ink-soft">
          {title}
        </h2>
        {selected && (
          <button type="button" onClick={() => onPick(undefined)} className="text-xs text-copper underline hover:text-copper-dark">
            Clear<span className="sr-only"> {title.toLowerCase()}</span>
          </button>
        )}
      </div>
      <ul className="space-y-px">
        {options.map((o) => {
          const on = o.value === selected;
          return (
            <li key={o.value}>
              <button
                type="button"
                aria-pressed={on}
                onClick={() => onPick(on ? undefined : o.value)}
                className={`flex w-full items-center gap-1.5 rounded px-2 py-1 text-left text-sm ${on ? 'bg-ink font-semibold text-paper' : 'hover:bg-black/5'}`}
              >
                <span aria-hidden="true" className={`inline-flex h-3.5 w-3.5 shrink-0 items-center justify-center rounded-sm border text-[10px] leading-none ${on ? 'border-paper' : 'border-ink-soft/50'}`}>
                  {on ? '✓' : ''}
                </span>
                <span className="min-w-0 flex-1 leading-tight">{o.label}</span>
                <span className={`num text-xs ${on ? 'text-paper/80' : 'text-ink-soft'}`}>{formatNumber(o.count)}</span>
              </button>
            </li>
          );
        })}
      </ul>
    </section>
  );
}
