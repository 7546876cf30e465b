import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { OutboxRow } from '@shared/contracts/mail.ts';
import { api } from '@/lib/api-client.ts';
import { mailKeys } from './keys.ts';

export const getOutbox = (to: string, page: number) => api<{ data: OutboxRow[]; total: number }>('/admin/outbox', { query: { to, page } });

export const outboxQueryOptions = (to: string, page: number) => queryOptions({ queryKey: mailKeys.list(to, page), queryFn: () => getOutbox(to, page), placeholderData: keepPreviousData });

export const useOutbox = (to: string, page: number) => useQuery(outboxQueryOptions(to, page));
