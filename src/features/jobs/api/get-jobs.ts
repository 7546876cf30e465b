import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { JobSummary } from '@shared/contracts/jobs.ts';
import { api } from '@/lib/api-client.ts';
import { jobKeys, type JobFilters } from './keys.ts';

export const getJobs = (filters: JobFilters) => api<{ data: JobSummary[]; total: number }>('/jobs', { query: filters });

export const jobsQueryOptions = (filters: JobFilters) => queryOptions({ queryKey: jobKeys.list(filters), queryFn: () => getJobs(filters), placeholderData: keepPreviousData });

export const useJobs = (filters: JobFilters) => useQuery(jobsQueryOptions(filters));
