import { queryOptions, useQuery } from '@tanstack/react-query';
import type { PortalSummary } from '@shared/contracts/portal.ts';
import { api } from '@/lib/api-client.ts';

export const portalKeys = { all: ['portal'] as const, summary: () => [...portalKeys.all, 'summary'] as const };

export const getPortalSummary = () => api<{ data: PortalSummary }>('/portal/summary').then((r) => r.data);

export const portalSummaryQueryOptions = () => queryOptions({ queryKey: portalKeys.summary(), queryFn: getPortalSummary });

export const usePortalSummary = () => useQuery(portalSummaryQueryOptions());
