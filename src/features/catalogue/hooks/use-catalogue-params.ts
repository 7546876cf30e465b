import { useCallback, useMemo } from 'react';
import { useSearchParams } from 'react-router';
import { PartListQuerySchema } from '@shared/contracts/parts.ts';
import { cleanFilters, type PartFilters } from '../api/get-parts.ts';

export type FilterKey = 'category' | 'maker' | 'range' | 'lifecycle' | 'inStock';
export const FILTER_KEYS: FilterKey[] = ['category', 'maker', 'range', 'lifecycle', 'inStock'];

const shape = PartListQuerySchema.shape;

/** Reads each parameter on its own, so one bad value in a shared link does not void the rest. */
function parse(params: URLSearchParams): PartFilters {
  const out: Record<string, unknown> = {};
  for (const key of Object.keys(shape) as (keyof typeof shape)[]) {
    const raw = params.get(key);
    if (raw === null) continue;
    const r = shape[key].safeParse(raw);
    if (r.success) out[key] = r.data;
  }
  return cleanFilters(out as PartFilters);
}

/** The catalogue's search, filters, sort and page, kept in the URL so a search can be shared and Back works. */
export function useCatalogueParams() {
  const [params, setParams] = useSearchParams();
  const filters = useMemo(() => parse(params), [params]);

  /** Changing anything but the page goes back to page 1. */
  const update = useCallback(
    (patch: PartFilters, { replace = false }: { replace?: boolean } = {}) => {
      setParams(
        (prev) => {
          const next = { ...parse(prev), ...patch };
          if (!('page' in patch)) delete next.page;
          const clean = cleanFilters(next);
          const out = new URLSearchParams();
          for (const [k, v] of Object.entries(clean)) out.set(k, String(v));
          return out;
        },
        { replace },
      );
    },
    [setParams],
  );

  return { filters, update };
}
