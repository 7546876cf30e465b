import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { DefaultBinInput, PartStockSettings, StockLimitInput } from '@shared/contracts/stock.ts';
import { api } from '@/lib/api-client.ts';
import { stockKeys } from './keys.ts';

export const getPartStockSettings = (sku: string) => api<{ data: PartStockSettings }>(`/stock/settings/${encodeURIComponent(sku)}`).then((r) => r.data);

export const usePartStockSettings = (sku: string) => useQuery({ queryKey: stockKeys.settings(sku), queryFn: () => getPartStockSettings(sku) });

export const setStockLimits = ({ sku, limits }: { sku: string; limits: StockLimitInput }) => api(`/stock/limits/${encodeURIComponent(sku)}`, { method: 'PUT', body: limits });

export const setDefaultBin = (input: DefaultBinInput) => api('/stock/default-bins', { method: 'PUT', body: input });

/** After either change the part's settings, stock levels (default-bin marks) and low-stock view are re-read. */
function useStockChange<T>(fn: (input: T) => Promise<unknown>) {
  const qc = useQueryClient();
  return useMutation({ mutationFn: fn, onSuccess: () => qc.invalidateQueries({ queryKey: stockKeys.all }) });
}

export const useSetStockLimits = () => useStockChange(setStockLimits);
export const useSetDefaultBin = () => useStockChange(setDefaultBin);
