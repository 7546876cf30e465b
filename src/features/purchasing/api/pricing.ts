import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { PriceBasis, Recompute } from '@shared/contracts/purchasing.ts';
import { api } from '@/lib/api-client.ts';
import { purchasingKeys } from './keys.ts';

export interface PricingRule {
  category: string;
  basis: PriceBasis;
  markupPct: number;
}
export interface Tier {
  id: string;
  code: string;
  name: string;
  discountPct: number;
  companies: { id: string; name: string }[];
}

export const getRules = () => api<{ data: PricingRule[] }>('/pricing/rules').then((r) => r.data);
export const useRules = () => useQuery({ queryKey: purchasingKeys.rules(), queryFn: getRules });

export const getTiers = () => api<{ data: Tier[]; customers: { id: string; name: string; tierId: string | null }[] }>('/pricing/tiers');
export const useTiers = () => useQuery({ queryKey: purchasingKeys.tiers(), queryFn: getTiers });

export const getRecomputes = () => api<{ data: Recompute[] }>('/pricing/recomputes').then((r) => r.data);
export const useRecomputes = () => useQuery({ queryKey: purchasingKeys.recomputes(), queryFn: getRecomputes });

export const saveRules = (rules: PricingRule[]) => api<{ data: { id: string; moved: number } }>('/pricing/rules', { method: 'PUT', body: { rules } }).then((r) => r.data);
export const setCustomerTier = ({ companyId, tierId }: { companyId: string; tierId: string | null }) => api(`/pricing/customers/${encodeURIComponent(companyId)}/tier`, { method: 'PUT', body: { tierId } });

export function useSaveRules() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: saveRules, onSuccess: () => qc.invalidateQueries({ queryKey: purchasingKeys.all }) });
}
export function useSetCustomerTier() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: setCustomerTier, onSuccess: () => qc.invalidateQueries({ queryKey: purchasingKeys.tiers() }) });
}
