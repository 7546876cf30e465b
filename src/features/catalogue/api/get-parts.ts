import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { PartListQuery, PartListResponse } from '@shared/contracts/parts.ts';
import { api } from '@/lib/api-client.ts';
import { partKeys } from './keys.ts';

/** What the catalogue page asks for; anything left out takes the server's default. */
export type PartFilters = Partial<PartListQuery>;

const FILTER_KEYS = ['q', 'category', 'maker', 'range', 'lifecycle', 'inStock', 'sort', 'dir', 'page', 'pageSize'] as const;

/** Drops empty and default values, so equal searches share one cache entry and one URL. */
export function cleanFilters(f: PartFilters): PartFilters {
  const out: Record<string, unknown> = {};
  for (const k of FILTER_KEYS) {
    const v = f[k];
    if (v === undefined || v === null || v === '') continue;
    if ((k === 'sort' && v === 'relevance') || (k === 'dir' && v === 'asc') || (k === 'page' && v === 1)) continue;
    out[k] = typeof v === 'string' ? v.trim() : v;
  }
  if (out.q === '') delete out.q;
  return out as PartFilters;
}

export const getParts = (filters: PartFilters, signal?: AbortSignal) => api<PartListResponse>('/parts', { query: cleanFilters(filters), signal });

export const partsQueryOptions = (filters: PartFilters) => {
  const clean = cleanFilters(filters);
  return queryOptions({
    queryKey: partKeys.list(clean),
    queryFn: ({ signal }) => getParts(clean, signal),
    // Keep the last results on screen while the next keystroke's answer is on its way.
    placeholderData: keepPreviousData,
    staleTime: 15_000,
  });
};

export const useParts = (filters: PartFilters) => useQuery(partsQueryOptions(filters));

/** The CSV export of the same search (every match, not just this page). */
export function partsExportHref(filters: PartFilters) {
  const { page: _page, pageSize: _size, ...rest } = cleanFilters(filters);
  const params = new URLSearchParams();
  for (const [k, v] of Object.entries(rest)) params.set(k, String(v));
  const s = params.toString();
  return `/api/parts/export.csv${s ? `?${s}` : ''}`;
}
