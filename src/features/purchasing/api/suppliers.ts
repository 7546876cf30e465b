import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { Supplier, SupplierInput, SupplierPart } from '@shared/contracts/purchasing.ts';
import { api } from '@/lib/api-client.ts';
import { purchasingKeys } from './keys.ts';

export interface PriceHistoryEntry {
  at: string;
  costCents: number;
  importId: string | null;
  by: string | null;
}

export const getSuppliers = () => api<{ data: Supplier[] }>('/suppliers').then((r) => r.data);
export const suppliersQueryOptions = () => queryOptions({ queryKey: purchasingKeys.suppliers(), queryFn: getSuppliers });
export const useSuppliers = () => useQuery(suppliersQueryOptions());

export const getSupplierParts = (id: string) => api<{ data: SupplierPart[] }>(`/suppliers/${encodeURIComponent(id)}/parts`).then((r) => r.data);
export const useSupplierParts = (id: string) => useQuery({ queryKey: purchasingKeys.supplierParts(id), queryFn: () => getSupplierParts(id) });

export const getPriceHistory = (id: string, sku: string) => api<{ data: PriceHistoryEntry[] }>(`/suppliers/${encodeURIComponent(id)}/parts/${encodeURIComponent(sku)}/history`).then((r) => r.data);
export const usePriceHistory = (id: string, sku: string | null) => useQuery({ queryKey: purchasingKeys.history(id, sku ?? ''), queryFn: () => getPriceHistory(id, sku!), enabled: !!sku });

export const saveSupplier = ({ id, input }: { id: string | null; input: SupplierInput }) =>
  api<{ data: { id: string } }>(id ? `/suppliers/${encodeURIComponent(id)}` : '/suppliers', { method: id ? 'PUT' : 'POST', body: input }).then((r) => r.data);
export function useSaveSupplier() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: saveSupplier, onSuccess: () => qc.invalidateQueries({ queryKey: purchasingKeys.suppliers() }) });
}

export interface MakerOption {
  code: string;
  name: string;
}
/** Makers, for parts created from price-list rows. */
export const getMakers = () => api<{ data: MakerOption[] }>('/makers').then((r) => r.data);
export const useMakers = () => useQuery({ queryKey: [...purchasingKeys.all, 'makers'], queryFn: getMakers, staleTime: 300_000 });
