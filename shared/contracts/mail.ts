import { z } from 'zod';
import { text } from './text.ts';

/** What a message is about; each has its template in server/mail/templates.ts. */
export const MAIL_EVENTS = [
  'invitation',
  'password-reset',
  'order-received',
  'backorders',
  'ready-for-collection',
  'dispatched',
  'payment-received',
  'refund',
  'purchase-order',
  'price-list-applied',
  'low-stock-digest',
] as const;
export type MailEvent = (typeof MAIL_EVENTS)[number];

export const MAIL_EVENT_LABELS: Record<MailEvent, string> = {
  invitation: 'Invitation',
  'password-reset': 'Password reset',
  'order-received': 'Order received',
  backorders: 'Reserved with backorders',
  'ready-for-collection': 'Ready for collection',
  dispatched: 'Dispatched',
  'payment-received': 'Card payment received',
  refund: 'Card payment refunded',
  'purchase-order': 'Purchase order to a supplier',
  'price-list-applied': 'Price list applied',
  'low-stock-digest': 'Low-stock digest',
};

/** queued → sending → sent; a refused attempt goes to retrying, the last refused one to failed. */
export const MAIL_STATUSES = ['queued', 'sending', 'sent', 'retrying', 'failed'] as const;
export type MailStatus = (typeof MAIL_STATUSES)[number];

export const OutboxQuerySchema = z.object({
  to: text().trim().max(200).optional(),
  page: z.coerce.number().int().min(1).max(10_000).default(1),
});
export type OutboxQuery = z.infer<typeof OutboxQuerySchema>;

export const OutboxRowSchema = z.object({
  id: text(),
  to: text(),
  subject: text(),
  event: z.enum(MAIL_EVENTS),
  status: z.enum(MAIL_STATUSES),
  createdAt: text(),
  sentAt: text().nullable(),
});
export type OutboxRow = z.infer<typeof OutboxRowSchema>;

export const OutboxListSchema = z.object({ data: z.array(OutboxRowSchema), total: z.number() });

export const OutboxMessageSchema = OutboxRowSchema.extend({
  text: text(),
  html: text(),
  attempts: z.number(),
  lastError: text().nullable(),
});
export type OutboxMessage = z.infer<typeof OutboxMessageSchema>;

export const OUTBOX_PAGE_SIZE = 50;
