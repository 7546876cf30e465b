import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { UserRow } from '@shared/contracts/users.ts';
import { api } from '@/lib/api-client.ts';
import { userKeys } from './keys.ts';

export const getUsers = (q: string) => api<{ data: UserRow[] }>('/admin/users', { query: { q } }).then((r) => r.data);

export const usersQueryOptions = (q: string) => queryOptions({ queryKey: userKeys.list(q), queryFn: () => getUsers(q), placeholderData: keepPreviousData });

export const useUsers = (q: string) => useQuery(usersQueryOptions(q));
