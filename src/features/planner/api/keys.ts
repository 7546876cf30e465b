import type { StackPlanRequest } from '@shared/contracts/stack-plans.ts';

export const plannerKeys = {
  all: ['planner'] as const,
  ranges: () => [...plannerKeys.all, 'range'] as const,
  range: (idOrCode: string) => [...plannerKeys.ranges(), idOrCode] as const,
  inverters: () => [...plannerKeys.all, 'inverters'] as const,
  plan: (req: StackPlanRequest) => [...plannerKeys.all, 'plan', req] as const,
  saved: () => [...plannerKeys.all, 'saved'] as const,
  savedList: () => [...plannerKeys.saved(), 'list'] as const,
  savedDetail: (id: string) => [...plannerKeys.saved(), 'detail', id] as const,
  customers: () => [...plannerKeys.all, 'customers'] as const,
};
