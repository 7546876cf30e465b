import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Label } from '@shared/contracts/warehouse.ts';
import { api } from '@/lib/api-client.ts';
import { warehouseKeys } from './keys.ts';

export const getLabels = (jobId: string) => api<{ data: Label[] }>(`/jobs/${encodeURIComponent(jobId)}/labels`).then((r) => r.data);

export const labelsQueryOptions = (jobId: string) => queryOptions({ queryKey: warehouseKeys.labels(jobId), queryFn: () => getLabels(jobId) });

export const useLabels = (jobId: string) => useQuery(labelsQueryOptions(jobId));

export const labelsPdfPath = (jobId: string, layout: 'a4' | 'thermal') => `/jobs/${encodeURIComponent(jobId)}/labels.pdf?layout=${layout}`;
