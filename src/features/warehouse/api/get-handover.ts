import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Handover } from '@shared/contracts/warehouse.ts';
import { api } from '@/lib/api-client.ts';
import { warehouseKeys } from './keys.ts';

export const getHandover = (jobId: string) => api<{ data: Handover }>(`/jobs/${encodeURIComponent(jobId)}/handover`).then((r) => r.data);

export const handoverQueryOptions = (jobId: string) => queryOptions({ queryKey: warehouseKeys.handover(jobId), queryFn: () => getHandover(jobId) });

export const useHandover = (jobId: string) => useQuery(handoverQueryOptions(jobId));

export const handoverPdfPath = (jobId: string) => `/jobs/${encodeURIComponent(jobId)}/handover.pdf`;
