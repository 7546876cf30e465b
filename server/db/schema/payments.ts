import { sql } from 'drizzle-orm';
import { bigint, bigserial, check, index, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import { PAYMENT_STATUSES } from '../../../shared/contracts/payments.ts';
import { jobs } from './jobs.ts';
import { user } from './auth.ts';

/** A card payment for a job through the payment provider's hosted checkout. */
export const payments = pgTable(
  'payments',
  {
    id: uuid().primaryKey().defaultRandom(),
    jobId: uuid()
      .notNull()
      .references(() => jobs.id),
    /** The provider's checkout session id (cs_…). */
    sessionId: text().notNull().unique(),
    /** The provider's payment id once paid (pi_…), which refunds name. */
    paymentIntentId: text(),
    amountCents: bigint({ mode: 'number' }).notNull(),
    currency: text().notNull().default('aud'),
    status: text({ enum: PAYMENT_STATUSES }).notNull().default('pending'),
    checkoutUrl: text().notNull(),
    createdBy: text().references(() => user.id),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    paidAt: timestamp({ withTimezone: true }),
    refundId: text(),
    refundedAt: timestamp({ withTimezone: true }),
    refundError: text(),
  },
  (t) => [
    index().on(t.jobId),
    // One paid (or refunded) payment per job at most: a second confirmation cannot charge twice.
    uniqueIndex('payments_one_paid_per_job').on(t.jobId).where(sql`${t.status} in ('paid', 'refunded')`),
    check('payments_status_known', sql`${t.status} in (${sql.raw(PAYMENT_STATUSES.map((s) => `'${s}'`).join(', '))})`),
    check('payments_amount_positive', sql`${t.amountCents} > 0`),
  ],
);

/** Provider events already handled (by the provider's event id): a repeated delivery changes nothing. */
export const paymentEvents = pgTable('payment_events', {
  eventId: text().primaryKey(),
  type: text().notNull(),
  receivedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
});

/** A tax invoice's number and date, fixed the first time the invoice is issued for a job. */
export const invoices = pgTable('invoices', {
  number: bigserial({ mode: 'number' }).primaryKey(),
  jobId: uuid()
    .notNull()
    .unique()
    .references(() => jobs.id),
  issuedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
});
