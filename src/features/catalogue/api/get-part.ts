import { queryOptions, useQuery } from '@tanstack/react-query';
import type { PartDetail } from '@shared/contracts/parts.ts';
import { api } from '@/lib/api-client.ts';
import { partKeys } from './keys.ts';

export const partPath = (sku: string) => `/parts/${encodeURIComponent(sku)}`;

export const getPart = (sku: string) => api<{ data: PartDetail }>(partPath(sku)).then((r) => r.data);

export const partQueryOptions = (sku: string) => queryOptions({ queryKey: partKeys.detail(sku), queryFn: () => getPart(sku) });

export const usePart = (sku: string) => useQuery(partQueryOptions(sku));
