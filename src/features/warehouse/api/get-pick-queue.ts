import { queryOptions, useQuery } from '@tanstack/react-query';
import type { PickQueueItem } from '@shared/contracts/warehouse.ts';
import { api } from '@/lib/api-client.ts';
import { warehouseKeys } from './keys.ts';

export const getPickQueue = () => api<{ data: PickQueueItem[] }>('/pick-queue').then((r) => r.data);

export const pickQueueQueryOptions = () => queryOptions({ queryKey: warehouseKeys.queue(), queryFn: getPickQueue, refetchInterval: 30_000 });

export const usePickQueue = () => useQuery(pickQueueQueryOptions());
