import { useMutation, useQueryClient, type QueryClient } from '@tanstack/react-query';
import type { PartDetail, PartInput } from '@shared/contracts/parts.ts';
import { api } from '@/lib/api-client.ts';
import { partPath } from './get-part.ts';
import { partKeys } from './keys.ts';

export const createPart = (input: PartInput) => api<{ data: PartDetail }>('/parts', { method: 'POST', body: input }).then((r) => r.data);

/** PATCH carries the whole part, as the form holds it. */
export const updatePart = (sku: string, input: PartInput) => api<{ data: PartDetail }>(partPath(sku), { method: 'PATCH', body: input }).then((r) => r.data);

/** After any change to a part: the fresh detail goes straight into the cache, lists refetch. */
export function storePart(qc: QueryClient, part: PartDetail, previousSku?: string) {
  if (previousSku && previousSku !== part.sku) qc.removeQueries({ queryKey: partKeys.detail(previousSku) });
  qc.setQueryData(partKeys.detail(part.sku), part);
  void qc.invalidateQueries({ queryKey: partKeys.lists() });
  void qc.invalidateQueries({ queryKey: partKeys.makers() });
}

export function useCreatePart() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: createPart, onSuccess: (p) => storePart(qc, p) });
}

export function useUpdatePart() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ sku, input }: { sku: string; input: PartInput }) => updatePart(sku, input),
    onSuccess: (p, { sku }) => storePart(qc, p, sku),
  });
}
