import { queryOptions, useQuery } from '@tanstack/react-query';
import type { SavedPlan, StackPlanResult } from '@shared/contracts/stack-plans.ts';
import { api } from '@/lib/api-client.ts';
import { plannerKeys } from './keys.ts';

export type SavedPlanDetail = SavedPlan & { plan: StackPlanResult };

/** A saved plan, recomputed by the server with today's parts and availability. */
export const getSavedPlan = (id: string) => api<{ data: SavedPlanDetail }>(`/stack-plans/saved/${encodeURIComponent(id)}`).then((r) => r.data);

export const savedPlanQueryOptions = (id: string) => queryOptions({ queryKey: plannerKeys.savedDetail(id), queryFn: () => getSavedPlan(id) });

export const useSavedPlan = (id: string) => useQuery(savedPlanQueryOptions(id));
