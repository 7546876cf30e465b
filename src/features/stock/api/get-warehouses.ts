import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Warehouse } from '@shared/contracts/stock.ts';
import { api } from '@/lib/api-client.ts';
import { stockKeys } from './keys.ts';

export const getWarehouses = () => api<{ data: Warehouse[] }>('/warehouses').then((r) => r.data);

export const warehousesQueryOptions = () => queryOptions({ queryKey: stockKeys.warehouses(), queryFn: getWarehouses, staleTime: 60_000 });

/** Staff only; pass `enabled: false` for roles that cannot see warehouses. */
export const useWarehouses = (enabled = true) => useQuery({ ...warehousesQueryOptions(), enabled });
