import type { OutboxMessage, OutboxRow } from '@shared/contracts/mail.ts';
import type { mailOutbox } from '../db/schema/index.ts';

type Row = Pick<typeof mailOutbox.$inferSelect, 'id' | 'to' | 'subject' | 'event' | 'status' | 'createdAt' | 'sentAt'>;

export function presentOutboxRow(r: Row): OutboxRow {
  return { id: r.id, to: r.to, subject: r.subject, event: r.event, status: r.status, createdAt: r.createdAt.toISOString(), sentAt: r.sentAt?.toISOString() ?? null };
}

export function presentOutboxMessage(r: typeof mailOutbox.$inferSelect): OutboxMessage {
  return { ...presentOutboxRow(r), text: r.text, html: r.html, attempts: r.attempts, lastError: r.lastError };
}
