import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { PickCompleteResult, PickList } from '@shared/contracts/warehouse.ts';
import { api } from '@/lib/api-client.ts';
import { warehouseKeys } from './keys.ts';

export const pausePick = (jobId: string) => api<{ data: PickList }>(`/jobs/${encodeURIComponent(jobId)}/pick/pause`, { method: 'POST' }).then((r) => r.data);
export const resumePick = (jobId: string) => api<{ data: PickList }>(`/jobs/${encodeURIComponent(jobId)}/pick/resume`, { method: 'POST' }).then((r) => r.data);
export const completePick = (jobId: string) => api<{ data: PickCompleteResult }>(`/jobs/${encodeURIComponent(jobId)}/pick/complete`, { method: 'POST' }).then((r) => r.data);

/** Pause or resume: the answer is the pick list as it now stands. */
export function usePickPause(jobId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (action: 'pause' | 'resume') => (action === 'pause' ? pausePick(jobId) : resumePick(jobId)),
    onSuccess: (list) => {
      qc.setQueryData(warehouseKeys.pick(jobId), list);
      return qc.invalidateQueries({ queryKey: warehouseKeys.queue() });
    },
  });
}

export function useCompletePick(jobId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: () => completePick(jobId),
    onSuccess: () => Promise.all([qc.invalidateQueries({ queryKey: warehouseKeys.all }), qc.invalidateQueries({ queryKey: ['jobs'] })]),
  });
}
