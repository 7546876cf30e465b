import type { MovementQuery, StockQuery } from '@shared/contracts/stock.ts';

export const stockKeys = {
  all: ['stock'] as const,
  levels: (q: Partial<StockQuery>) => [...stockKeys.all, 'levels', q] as const,
  movements: (q: Partial<MovementQuery>) => [...stockKeys.all, 'movements', q] as const,
  low: () => [...stockKeys.all, 'low'] as const,
  warehouses: () => [...stockKeys.all, 'warehouses'] as const,
  settings: (sku: string) => [...stockKeys.all, 'settings', sku] as const,
};
