import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Job } from '@shared/contracts/jobs.ts';
import { api } from '@/lib/api-client.ts';
import { jobKeys } from './keys.ts';

export const getJob = (id: string) => api<{ data: Job }>(`/jobs/${encodeURIComponent(id)}`).then((r) => r.data);

export const jobQueryOptions = (id: string) => queryOptions({ queryKey: jobKeys.detail(id), queryFn: () => getJob(id) });

/** `pollUntil`: look again every 1.5 s until it says the job is as wanted (a payment confirmed elsewhere). */
export const useJob = (id: string, pollUntil?: (job: Job) => boolean) =>
  useQuery({ ...jobQueryOptions(id), refetchInterval: pollUntil ? (q) => (q.state.data && pollUntil(q.state.data) ? false : 1500) : false });
