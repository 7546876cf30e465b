import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { StackPlanRequest, StackPlanResult } from '@shared/contracts/stack-plans.ts';
import { api } from '@/lib/api-client.ts';
import { plannerKeys } from './keys.ts';

/** The server's plan: the same arithmetic as the browser's, plus live availability per warehouse. */
export const planStackOnServer = (req: StackPlanRequest, signal?: AbortSignal) =>
  api<{ data: StackPlanResult }>('/stack-plans', { method: 'POST', body: req, signal }).then((r) => r.data);

export const stackPlanQueryOptions = (req: StackPlanRequest) =>
  queryOptions({
    queryKey: plannerKeys.plan(req),
    queryFn: ({ signal }) => planStackOnServer(req, signal),
    // The last answer stays on screen (its stock figures still hold) while the next is on its way.
    placeholderData: keepPreviousData,
    staleTime: 15_000,
    retry: false,
  });

export const useStackPlan = (req: StackPlanRequest | null) =>
  useQuery({ ...stackPlanQueryOptions(req ?? { rangeId: '' }), enabled: !!req });
