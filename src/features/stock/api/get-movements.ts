import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { Movement, MovementQuery } from '@shared/contracts/stock.ts';
import { api } from '@/lib/api-client.ts';
import { stockKeys } from './keys.ts';

export const getMovements = (q: Partial<MovementQuery>) => api<{ data: Movement[]; total: number }>('/stock/movements', { query: q });

export const movementsQueryOptions = (q: Partial<MovementQuery>) => queryOptions({ queryKey: stockKeys.movements(q), queryFn: () => getMovements(q), placeholderData: keepPreviousData });

export const useMovements = (q: Partial<MovementQuery>) => useQuery(movementsQueryOptions(q));
