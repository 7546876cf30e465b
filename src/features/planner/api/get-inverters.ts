import { queryOptions, useQuery } from '@tanstack/react-query';
import type { z } from 'zod';
import type { InverterOptionSchema } from '@shared/contracts/stack-plans.ts';
import { api } from '@/lib/api-client.ts';
import { plannerKeys } from './keys.ts';

export type InverterOption = z.infer<typeof InverterOptionSchema>;

export const getInverters = () => api<{ data: InverterOption[] }>('/inverters').then((r) => r.data);

export const invertersQueryOptions = () => queryOptions({ queryKey: plannerKeys.inverters(), queryFn: getInverters, staleTime: 5 * 60_000 });

export const useInverters = () => useQuery(invertersQueryOptions());
