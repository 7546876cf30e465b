import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SavedPlan, SavePlanInput } from '@shared/contracts/stack-plans.ts';
import { api } from '@/lib/api-client.ts';
import { plannerKeys } from './keys.ts';

export const savePlan = (input: SavePlanInput) => api<{ data: SavedPlan }>('/stack-plans/saved', { method: 'POST', body: input }).then((r) => r.data);

export function useSavePlan() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: savePlan, onSuccess: () => qc.invalidateQueries({ queryKey: plannerKeys.saved() }) });
}
