import { queryOptions, useQuery } from '@tanstack/react-query';
import type { OutboxMessage } from '@shared/contracts/mail.ts';
import { api } from '@/lib/api-client.ts';
import { mailKeys } from './keys.ts';

export const getOutboxMessage = (id: string) => api<{ data: OutboxMessage }>(`/admin/outbox/${encodeURIComponent(id)}`).then((r) => r.data);

export const outboxMessageQueryOptions = (id: string) => queryOptions({ queryKey: mailKeys.detail(id), queryFn: () => getOutboxMessage(id) });

export const useOutboxMessage = (id: string) => useQuery(outboxMessageQueryOptions(id));
