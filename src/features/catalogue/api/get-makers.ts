import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Maker } from '@shared/contracts/parts.ts';
import { api } from '@/lib/api-client.ts';
import { partKeys } from './keys.ts';

export const getMakers = () => api<{ data: Maker[] }>('/makers').then((r) => r.data);

export const makersQueryOptions = () => queryOptions({ queryKey: partKeys.makers(), queryFn: getMakers, staleTime: 5 * 60_000 });

export const useMakers = () => useQuery(makersQueryOptions());
