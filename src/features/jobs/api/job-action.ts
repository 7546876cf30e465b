import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Job } from '@shared/contracts/jobs.ts';
import { api } from '@/lib/api-client.ts';
import { jobKeys } from './keys.ts';

export type JobAction = 'order' | 'reserve' | 'release' | 'cancel' | 'gather' | 'dispatch' | 'collect' | 'close';

export const runJobAction = (id: string, action: JobAction) => api<{ data: Job }>(`/jobs/${encodeURIComponent(id)}/${action}`, { method: 'POST' }).then((r) => r.data);

/** Order, reserve, release or cancel: the answer is the job as it now stands. */
export function useJobAction(id: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (action: JobAction) => runJobAction(id, action),
    onSuccess: (job) => {
      qc.setQueryData(jobKeys.detail(id), job);
      return qc.invalidateQueries({ queryKey: jobKeys.lists() });
    },
  });
}
