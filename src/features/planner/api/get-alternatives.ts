import { queryOptions, useQuery } from '@tanstack/react-query';
import type { StackPlanRequest } from '@shared/contracts/stack-plans.ts';
import type { PlanAlternatives } from '@shared/contracts/portal.ts';
import { api } from '@/lib/api-client.ts';
import { plannerKeys } from './keys.ts';

export const getPlanAlternatives = (req: StackPlanRequest, signal?: AbortSignal) =>
  api<{ data: PlanAlternatives }>('/stack-plans/alternatives', { method: 'POST', body: req, signal }).then((r) => r.data);

export const planAlternativesQueryOptions = (req: StackPlanRequest) =>
  queryOptions({ queryKey: [...plannerKeys.plan(req), 'alternatives'], queryFn: ({ signal }) => getPlanAlternatives(req, signal), staleTime: 15_000, retry: false });

/** Plans fully available now, asked for only when the plan on screen has short lines. */
export const usePlanAlternatives = (req: StackPlanRequest | null) => useQuery({ ...planAlternativesQueryOptions(req ?? { rangeId: '' }), enabled: !!req });
