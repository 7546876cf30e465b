import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { DispatchInput, Job } from '@shared/contracts/jobs.ts';
import { api } from '@/lib/api-client.ts';
import { jobKeys } from './keys.ts';

export type JobAction = 'order' | 'reserve' | 'release' | 'cancel' | 'gather' | 'dispatch' | 'collect' | 'close';

/** An action with what it carries: only a dispatch names its carrier and tracking reference. */
export type JobActionCall = { action: Exclude<JobAction, 'dispatch'> } | { action: 'dispatch'; sent: DispatchInput };

const runJobAction = (id: string, call: JobActionCall) =>
  api<{ data: Job }>(`/jobs/${encodeURIComponent(id)}/${call.action}`, { method: 'POST', ...(call.action === 'dispatch' ? { body: call.sent } : {}) }).then((r) => r.data);

/** Order, reserve, release or cancel: the answer is the job as it now stands. */
export function useJobAction(id: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (call: JobActionCall) => runJobAction(id, call),
    onSuccess: (job) => {
      qc.setQueryData(jobKeys.detail(id), job);
      return qc.invalidateQueries({ queryKey: jobKeys.lists() });
    },
  });
}
