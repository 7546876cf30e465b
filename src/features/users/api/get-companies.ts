import { queryOptions, useQuery } from '@tanstack/react-query';
import type { CompanyOption } from '@shared/contracts/users.ts';
import { api } from '@/lib/api-client.ts';
import { userKeys } from './keys.ts';

export const getCompanies = () => api<{ data: CompanyOption[] }>('/admin/companies').then((r) => r.data);

export const companiesQueryOptions = () => queryOptions({ queryKey: userKeys.companies(), queryFn: getCompanies, staleTime: 5 * 60_000 });

export const useCompanies = () => useQuery(companiesQueryOptions());
