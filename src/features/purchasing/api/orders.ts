import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { PoReceiptInput, PoStatus, PurchaseOrder, Suggestion } from '@shared/contracts/purchasing.ts';
import type { LedgerResult } from '@shared/contracts/stock.ts';
import { api } from '@/lib/api-client.ts';
import { purchasingKeys } from './keys.ts';

export interface PoSummary {
  id: string;
  number: string;
  status: PoStatus;
  supplier: string;
  warehouse: string;
  lines: number;
  units: number;
  received: number;
  exCents: number | null;
  createdAt: string;
}

const base = (id: string) => `/purchase-orders/${encodeURIComponent(id)}`;

export const getSuggestions = () => api<{ data: Suggestion[] }>('/reorder/suggestions').then((r) => r.data);
export const useSuggestions = () => useQuery({ queryKey: purchasingKeys.suggestions(), queryFn: getSuggestions });

export const getOrders = () => api<{ data: PoSummary[] }>('/purchase-orders').then((r) => r.data);
export const useOrders = () => useQuery({ queryKey: purchasingKeys.orders(), queryFn: getOrders });

export const getOrder = (id: string) => api<{ data: PurchaseOrder }>(base(id)).then((r) => r.data);
export const useOrder = (id: string) => useQuery({ queryKey: purchasingKeys.order(id), queryFn: () => getOrder(id) });

export const draftOrders = (lines: { sku: string; qty: number }[]) => api<{ data: { id: string; number: string }[] }>('/reorder/draft-orders', { method: 'POST', body: { lines } }).then((r) => r.data);
export const orderAction = ({ id, action }: { id: string; action: 'send' | 'close' }) => api(`${base(id)}/${action}`, { method: 'POST' });
export const receiveOrder = ({ id, input }: { id: string; input: PoReceiptInput }) => api<{ data: LedgerResult }>(`${base(id)}/receipts`, { method: 'POST', body: input }).then((r) => r.data);

/** Orders change stock's "on order" and, when received, stock and jobs: re-read all three. */
function useOrderMutation<I, O>(fn: (input: I) => Promise<O>) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: fn,
    onSuccess: () => Promise.all([qc.invalidateQueries({ queryKey: purchasingKeys.all }), qc.invalidateQueries({ queryKey: ['stock'] }), qc.invalidateQueries({ queryKey: ['jobs'] })]),
  });
}
export const useDraftOrders = () => useOrderMutation(draftOrders);
export const useOrderAction = () => useOrderMutation(orderAction);
export const useReceiveOrder = () => useOrderMutation(receiveOrder);
