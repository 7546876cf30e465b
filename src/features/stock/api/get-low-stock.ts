import { queryOptions, useQuery } from '@tanstack/react-query';
import type { LowStock } from '@shared/contracts/stock.ts';
import { api } from '@/lib/api-client.ts';
import { stockKeys } from './keys.ts';

export const getLowStock = () => api<{ data: LowStock[] }>('/stock/low').then((r) => r.data);

export const lowStockQueryOptions = () => queryOptions({ queryKey: stockKeys.low(), queryFn: getLowStock });

export const useLowStock = () => useQuery(lowStockQueryOptions());
