import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateJobInput, Job } from '@shared/contracts/jobs.ts';
import { api } from '@/lib/api-client.ts';
import { jobKeys } from './keys.ts';

export const createJob = (input: CreateJobInput) => api<{ data: Job }>('/jobs', { method: 'POST', body: input }).then((r) => r.data);

export function useCreateJob() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: createJob,
    onSuccess: (job) => {
      qc.setQueryData(jobKeys.detail(job.id), job);
      return qc.invalidateQueries({ queryKey: jobKeys.lists() });
    },
  });
}
