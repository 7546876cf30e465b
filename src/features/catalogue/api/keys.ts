import type { PartFilters } from './get-parts.ts';

export const partKeys = {
  all: ['parts'] as const,
  lists: () => [...partKeys.all, 'list'] as const,
  list: (filters: PartFilters) => [...partKeys.lists(), filters] as const,
  details: () => [...partKeys.all, 'detail'] as const,
  detail: (sku: string) => [...partKeys.details(), sku] as const,
  makers: () => [...partKeys.all, 'makers'] as const,
  ranges: () => [...partKeys.all, 'ranges'] as const,
};
