import { useCallback, useMemo } from 'react';
import { useSearchParams } from 'react-router';

export type PlanMode = 'modules' | 'target';

/** What the planner is asked, kept in the URL so a plan can be bookmarked, shared and reopened. */
export interface PlannerParams {
  range: string | null;
  mode: PlanMode;
  /** As typed, so a half-typed number stays in the box. */
  modules: string;
  stacks: string;
  kwh: string;
  inverter: string | null;
}

const KEYS = ['range', 'mode', 'modules', 'stacks', 'kwh', 'inverter'] as const;

export function usePlannerParams() {
  const [search, setSearch] = useSearchParams();
  const params = useMemo<PlannerParams>(
    () => ({
      range: search.get('range'),
      mode: search.get('mode') === 'target' ? 'target' : 'modules',
      modules: search.get('modules') ?? '',
      stacks: search.get('stacks') ?? '1',
      kwh: search.get('kwh') ?? '',
      inverter: search.get('inverter'),
    }),
    [search],
  );
  const update = useCallback(
    (patch: Partial<PlannerParams>) =>
      setSearch(
        (prev) => {
          const next = new URLSearchParams(prev);
          for (const k of KEYS) {
            if (!(k in patch)) continue;
            const v = patch[k];
            if (v === null || v === undefined || v === '') next.delete(k);
            else next.set(k, String(v));
          }
          return next;
        },
        { replace: true },
      ),
    [setSearch],
  );
  return { params, update };
}

/** The number typed in a box (modules, stacks or kWh), or null while it is empty or not a number. */
export function numberOrNull(text: string): number | null {
  if (text.trim() === '') return null;
  const n = Number(text);
  return Number.isFinite(n) ? n : null;
}
