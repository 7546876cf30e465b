import { queryOptions, useQuery } from '@tanstack/react-query';
import type { PickList } from '@shared/contracts/warehouse.ts';
import { api } from '@/lib/api-client.ts';
import { warehouseKeys } from './keys.ts';

export const getPickList = (jobId: string) => api<{ data: PickList }>(`/jobs/${encodeURIComponent(jobId)}/pick`).then((r) => r.data);

export const pickListQueryOptions = (jobId: string) => queryOptions({ queryKey: warehouseKeys.pick(jobId), queryFn: () => getPickList(jobId) });

export const usePickList = (jobId: string) => useQuery(pickListQueryOptions(jobId));
