import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Job } from '@shared/contracts/jobs.ts';
import { api } from '@/lib/api-client.ts';
import { jobKeys } from './keys.ts';

export const reorderJob = (id: string) => api<{ data: Job }>(`/jobs/${encodeURIComponent(id)}/reorder`, { method: 'POST' }).then((r) => r.data);

/** A new draft with the same lines; the answer is the new job. */
export function useReorderJob(id: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: () => reorderJob(id),
    onSuccess: (job) => {
      qc.setQueryData(jobKeys.detail(job.id), job);
      return qc.invalidateQueries({ queryKey: jobKeys.lists() });
    },
  });
}
