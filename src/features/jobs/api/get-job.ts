import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Job } from '@shared/contracts/jobs.ts';
import { api } from '@/lib/api-client.ts';
import { jobKeys } from './keys.ts';

export const getJob = (id: string) => api<{ data: Job }>(`/jobs/${encodeURIComponent(id)}`).then((r) => r.data);

export const jobQueryOptions = (id: string) => queryOptions({ queryKey: jobKeys.detail(id), queryFn: () => getJob(id) });

export const useJob = (id: string) => useQuery(jobQueryOptions(id));
