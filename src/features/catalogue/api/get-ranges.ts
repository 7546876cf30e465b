import { queryOptions, useQuery } from '@tanstack/react-query';
import type { RangeSummary } from '@shared/contracts/parts.ts';
import { api } from '@/lib/api-client.ts';
import { partKeys } from './keys.ts';

export const getRanges = () => api<{ data: RangeSummary[] }>('/ranges').then((r) => r.data);

export const rangesQueryOptions = () => queryOptions({ queryKey: partKeys.ranges(), queryFn: getRanges, staleTime: 5 * 60_000 });

export const useRanges = () => useQuery(rangesQueryOptions());
