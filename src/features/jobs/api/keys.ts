import type { JobListQuery } from '@shared/contracts/jobs.ts';

export type JobFilters = Partial<Pick<JobListQuery, 'status' | 'companyId' | 'q' | 'from' | 'to' | 'page' | 'pageSize'>>;

export const jobKeys = {
  all: ['jobs'] as const,
  lists: () => [...jobKeys.all, 'list'] as const,
  list: (filters: JobFilters) => [...jobKeys.lists(), filters] as const,
  detail: (id: string) => [...jobKeys.all, 'detail', id] as const,
};
