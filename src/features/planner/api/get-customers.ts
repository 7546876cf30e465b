import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client.ts';
import { plannerKeys } from './keys.ts';

export interface CustomerOption {
  id: string;
  name: string;
}

/** Customer accounts staff may plan for (installers always plan for their own company). */
export const getCustomers = () => api<{ data: CustomerOption[] }>('/customers').then((r) => r.data);

export const customersQueryOptions = () => queryOptions({ queryKey: plannerKeys.customers(), queryFn: getCustomers, staleTime: 5 * 60_000 });

export const useCustomers = (enabled: boolean) => useQuery({ ...customersQueryOptions(), enabled });
