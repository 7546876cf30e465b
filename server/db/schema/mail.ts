import { sql } from 'drizzle-orm';
import { check, index, integer, jsonb, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { MAIL_EVENTS, MAIL_STATUSES } from '../../../shared/contracts/mail.ts';

const list = (values: readonly string[]) => sql.raw(values.map((s) => `'${s}'`).join(', '));

/**
 * Every message the app means to send, written in the same transaction as the business change it
 * reports (rolled back with it), then sent by the mail queue (server/jobs/mail-queue.ts). The admin
 * outbox page reads this table.
 */
export const mailOutbox = pgTable(
  'mail_outbox',
  {
    id: uuid().primaryKey().defaultRandom(),
    event: text({ enum: MAIL_EVENTS }).notNull(),
    to: text().notNull(),
    subject: text().notNull(),
    text: text().notNull(),
    html: text().notNull(),
    status: text({ enum: MAIL_STATUSES }).notNull().default('queued'),
    attempts: integer().notNull().default(0),
    lastError: text(),
    /** What the message is about (job id, purchase order id…), for finding it again. */
    refs: jsonb().$type<Record<string, string>>().notNull().default({}),
    /** The SMTP server's message id once accepted. */
    messageId: text(),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    /** When a sender last took it up: how the sweep tells a dead sender from a slow queue. */
    attemptedAt: timestamp({ withTimezone: true }),
    sentAt: timestamp({ withTimezone: true }),
  },
  (t) => [
    index().on(t.createdAt),
    index().on(t.to, t.createdAt),
    index().on(t.status, t.createdAt),
    check('mail_outbox_event_known', sql`${t.event} in (${list(MAIL_EVENTS)})`),
    check('mail_outbox_status_known', sql`${t.status} in (${list(MAIL_STATUSES)})`),
  ],
);

/**
 * The local SMTP stand-in's mailbox (server/mail/standin): what it received, parsed. A real SMTP
 * server (SMTP_URL) never writes here.
 */
export const standinMailbox = pgTable(
  'standin_mailbox',
  {
    id: uuid().primaryKey().defaultRandom(),
    envelopeFrom: text(),
    envelopeTo: text().array().notNull(),
    messageId: text(),
    subject: text(),
    text: text(),
    html: text(),
    raw: text().notNull(),
    receivedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index().on(t.receivedAt)],
);
