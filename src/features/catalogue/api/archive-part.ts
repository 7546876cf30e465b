import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { PartDetail } from '@shared/contracts/parts.ts';
import { api } from '@/lib/api-client.ts';
import { partPath } from './get-part.ts';
import { storePart } from './save-part.ts';

export const archivePart = (sku: string) => api<{ data: PartDetail }>(`${partPath(sku)}/archive`, { method: 'POST' }).then((r) => r.data);
export const restorePart = (sku: string) => api<{ data: PartDetail }>(`${partPath(sku)}/restore`, { method: 'POST' }).then((r) => r.data);

export function useArchivePart() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: archivePart, onSuccess: (p) => storePart(qc, p) });
}

export function useRestorePart() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: restorePart, onSuccess: (p) => storePart(qc, p) });
}
