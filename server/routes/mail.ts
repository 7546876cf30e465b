import { z } from 'zod';
import { IdParamsSchema as IdParams } from '@shared/contracts/common.ts';
import { OutboxListSchema, OutboxMessageSchema, OutboxQuerySchema } from '@shared/contracts/mail.ts';
import type { Api } from '../http/route.ts';
import type { AppDeps } from '../deps.ts';
import { presentOutboxMessage, presentOutboxRow } from '../presenters/mail.ts';


export function mailRoutes(api: Api, { mail }: Pick<AppDeps, 'mail'>) {
  api.route({ method: 'get', path: '/admin/outbox', summary: 'Messages the app has sent or is sending, newest first (filter by recipient)', tag: 'mail', ability: 'outbox.view', query: OutboxQuerySchema, response: OutboxListSchema }, async ({ actor, query }) => {
    const { rows, total } = await mail.outbox(actor, query);
    return { data: rows.map(presentOutboxRow), total };
  });

  api.route({ method: 'get', path: '/admin/outbox/:id', summary: 'One message with its text and HTML parts', tag: 'mail', ability: 'outbox.view', params: IdParams, response: z.object({ data: OutboxMessageSchema }) }, async ({ actor, params }) => ({
    data: presentOutboxMessage(await mail.outboxMessage(actor, params.id)),
  }));
}
