import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { StockLevel, StockQuery } from '@shared/contracts/stock.ts';
import { api } from '@/lib/api-client.ts';
import { stockKeys } from './keys.ts';

export const getStock = (q: Partial<StockQuery>) => api<{ data: StockLevel[]; total: number }>('/stock', { query: q });

export const stockQueryOptions = (q: Partial<StockQuery>) => queryOptions({ queryKey: stockKeys.levels(q), queryFn: () => getStock(q), placeholderData: keepPreviousData });

export const useStock = (q: Partial<StockQuery>) => useQuery(stockQueryOptions(q));
