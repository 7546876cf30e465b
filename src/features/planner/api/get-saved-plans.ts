import { queryOptions, useQuery } from '@tanstack/react-query';
import type { SavedPlan } from '@shared/contracts/stack-plans.ts';
import { api } from '@/lib/api-client.ts';
import { plannerKeys } from './keys.ts';

export const getSavedPlans = () => api<{ data: SavedPlan[] }>('/stack-plans/saved').then((r) => r.data);

export const savedPlansQueryOptions = () => queryOptions({ queryKey: plannerKeys.savedList(), queryFn: getSavedPlans });

export const useSavedPlans = () => useQuery(savedPlansQueryOptions());
