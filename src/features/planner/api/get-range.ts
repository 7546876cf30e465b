import { queryOptions, useQuery } from '@tanstack/react-query';
import type { RangeDetail } from '@shared/contracts/stack-plans.ts';
import { api } from '@/lib/api-client.ts';
import { plannerKeys } from './keys.ts';

export const getRange = (idOrCode: string) => api<{ data: RangeDetail }>(`/ranges/${encodeURIComponent(idOrCode)}`).then((r) => r.data);

export const rangeQueryOptions = (idOrCode: string) =>
  queryOptions({ queryKey: plannerKeys.range(idOrCode), queryFn: () => getRange(idOrCode), staleTime: 5 * 60_000 });

export const useRange = (idOrCode: string | null | undefined) => useQuery({ ...rangeQueryOptions(idOrCode ?? ''), enabled: !!idOrCode });
