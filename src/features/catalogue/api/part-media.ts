import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Media } from '@shared/contracts/parts.ts';
import { api } from '@/lib/api-client.ts';
import { partPath } from './get-part.ts';
import { partKeys } from './keys.ts';

/** The server decides the kind from the file's content, not its name. */
export function uploadPartMedia(sku: string, file: File) {
  const body = new FormData();
  body.append('file', file);
  return api<{ data: Media }>(`${partPath(sku)}/media`, { method: 'POST', body }).then((r) => r.data);
}

export const deletePartMedia = (sku: string, id: string) => api<void>(`${partPath(sku)}/media/${encodeURIComponent(id)}`, { method: 'DELETE' });

export function useUploadPartMedia(sku: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (file: File) => uploadPartMedia(sku, file),
    onSettled: () => Promise.all([qc.invalidateQueries({ queryKey: partKeys.detail(sku) }), qc.invalidateQueries({ queryKey: partKeys.lists() })]),
  });
}

export function useDeletePartMedia(sku: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (id: string) => deletePartMedia(sku, id),
    onSettled: () => Promise.all([qc.invalidateQueries({ queryKey: partKeys.detail(sku) }), qc.invalidateQueries({ queryKey: partKeys.lists() })]),
  });
}
