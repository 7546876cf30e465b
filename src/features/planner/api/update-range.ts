import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { RangeDetail, RangeInput } from '@shared/contracts/stack-plans.ts';
import { api } from '@/lib/api-client.ts';
import { plannerKeys } from './keys.ts';

export const updateRange = (idOrCode: string, input: RangeInput) =>
  api<{ data: RangeDetail }>(`/ranges/${encodeURIComponent(idOrCode)}`, { method: 'PUT', body: input }).then((r) => r.data);

export function useUpdateRange() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ idOrCode, input }: { idOrCode: string; input: RangeInput }) => updateRange(idOrCode, input),
    onSuccess: (detail) => {
      qc.setQueryData(plannerKeys.range(detail.code), detail);
      return qc.invalidateQueries({ queryKey: plannerKeys.all });
    },
  });
}
