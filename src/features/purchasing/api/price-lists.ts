import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { ColumnMapping, ImportStatus, Preview, PreviewQuery, PriceList, RowLinkInput } from '@shared/contracts/purchasing.ts';
import { api } from '@/lib/api-client.ts';
import { purchasingKeys } from './keys.ts';

export interface PriceListSummary {
  id: string;
  supplier: string;
  supplierCode: string;
  fileName: string;
  fileKind: 'csv' | 'xlsx';
  status: ImportStatus;
  counts: Record<string, number>;
  createdAt: string;
  createdBy: string | null;
  appliedAt: string | null;
}

const base = (id: string) => `/price-lists/${encodeURIComponent(id)}`;

export const getPriceLists = () => api<{ data: PriceListSummary[] }>('/price-lists').then((r) => r.data);
export const usePriceLists = () => useQuery(queryOptions({ queryKey: purchasingKeys.priceLists(), queryFn: getPriceLists }));

export const getPriceList = (id: string) => api<{ data: PriceList }>(base(id)).then((r) => r.data);
/** One import; polls while `busy` so the progress bar moves during a long check or apply. */
export const usePriceList = (id: string, busy = false) => useQuery({ queryKey: purchasingKeys.priceList(id), queryFn: () => getPriceList(id), refetchInterval: busy ? 400 : false });

export const getPreview = (id: string, q: Partial<PreviewQuery>) => api<{ data: Preview }>(`${base(id)}/preview`, { query: q }).then((r) => r.data);
export const usePreview = (id: string, q: Partial<PreviewQuery>, enabled: boolean) => useQuery({ queryKey: purchasingKeys.preview(id, q), queryFn: () => getPreview(id, q), enabled });

export const uploadPriceList = ({ supplierId, file }: { supplierId: string; file: File }) => {
  const form = new FormData();
  form.set('supplierId', supplierId);
  form.set('file', file);
  return api<{ data: PriceList }>('/price-lists', { method: 'POST', body: form }).then((r) => r.data);
};
export function useUploadPriceList() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: uploadPriceList, onSuccess: () => qc.invalidateQueries({ queryKey: purchasingKeys.priceLists() }) });
}

export const setMapping = ({ id, mapping, sheet }: { id: string; mapping: ColumnMapping; sheet?: string }) => api<{ data: PriceList }>(`${base(id)}/mapping`, { method: 'PUT', body: { mapping, ...(sheet ? { sheet } : {}) } }).then((r) => r.data);
export const linkRows = ({ id, links }: { id: string; links: RowLinkInput['links'] }) => api<{ data: PriceList }>(`${base(id)}/links`, { method: 'POST', body: { links } }).then((r) => r.data);
export const applyPriceList = (id: string) => api<{ data: { applied: boolean; counts: Preview['counts']; pricesMoved: number } }>(`${base(id)}/apply`, { method: 'POST' }).then((r) => r.data);

/** Mapping, linking and applying all change what the import page shows: re-read it afterwards. */
function useImportMutation<I, O>(id: string, fn: (input: I) => Promise<O>) {
  const qc = useQueryClient();
  return useMutation({ mutationFn: fn, onSettled: () => qc.invalidateQueries({ queryKey: purchasingKeys.all }) });
}
export const useSetMapping = (id: string) => useImportMutation(id, (input: { mapping: ColumnMapping; sheet?: string }) => setMapping({ id, ...input }));
export const useLinkRows = (id: string) => useImportMutation(id, (links: RowLinkInput['links']) => linkRows({ id, links }));
export const useApplyPriceList = (id: string) => useImportMutation(id, () => applyPriceList(id));
