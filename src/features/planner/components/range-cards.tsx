import type { RangeSummary } from '@shared/contracts/parts.ts';
import type { RangeDetail } from '@shared/contracts/stack-plans.ts';
import { nominalKwh } from '@shared/domain/energy.ts';
import { formatNumber } from '@/lib/format.ts';
import { plannerRangeOf } from '../lib/plan-view.ts';

function ModuleLine({ detail }: { detail: RangeDetail | undefined }) {
  if (!detail) return <span className="text-ink-soft">…</span>;
  const m = plannerRangeOf(detail).module;
  const kwh = m.usableKwh ?? nominalKwh(m.nominalV, m.ratedAh);
  return (
    <span>
      module <span className="num">{formatNumber(kwh)}</span> kWh{m.usableKwh != null ? ' usable' : ''}, <span className="num">{formatNumber(m.nominalV)}</span> V
    </span>
  );
}

/** The ranges to plan with, as cards; the chosen one is pressed. */
export function RangeCards({ ranges, details, selected, onSelect }: { ranges: RangeSummary[]; details: Record<string, RangeDetail | undefined>; selected: string | null; onSelect: (r: RangeSummary) => void }) {
  return (
    <div role="group" aria-label="Range" className="grid gap-2 sm:grid-cols-2 xl:grid-cols-4">
      {ranges.map((r) => {
        const on = r.code === selected;
        return (
          <button
            key={r.code}
            type="button"
            aria-pressed={on}
            onClick={() => onSelect(r)}
            className={`rounded-lg border bg-card p-3 text-left transition-colors ${on ? 'border-copper ring-2 ring-copper/40' : 'border-line hover:border-ink-soft'}`}
          >
            <span className="flex items-start justify-between gap-2">
              <span className="font-semibold leading-tight">{r.name}</span>
              {on && (
                <span aria-hidden="true" className="inline-flex h-5 w-5 shrink-0 items-center justify-center rounded-full bg-copper text-xs text-white">
                  ✓
                </span>
              )}
            </span>
            <span className="block text-xs text-ink-soft">
              {r.makerName} · <span className="num">{r.code}</span>
            </span>
            <span className="mt-2 block text-xs">
              <span className="font-medium">{r.connection === 'series' ? 'Series, high voltage' : 'Parallel, 48 V class'}</span>
              {' · '}
              <span className="num">
                {r.minModules}–{r.maxModules}
              </span>{' '}
              modules per stack
              {r.maxStacks > 1 && (
                <>
                  , up to <span className="num">{r.maxStacks}</span> stacks
                </>
              )}
            </span>
            <span className="mt-0.5 block text-xs text-ink-soft">
              <ModuleLine detail={details[r.code]} />
            </span>
          </button>
        );
      })}
    </div>
  );
}
