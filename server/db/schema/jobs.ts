import { sql } from 'drizzle-orm';
import { bigint, bigserial, boolean, check, index, integer, pgTable, primaryKey, text, timestamp, unique, uuid } from 'drizzle-orm/pg-core';
import { JOB_STATUSES } from '../../../shared/contracts/jobs.ts';
import { companies } from './companies.ts';
import { parts } from './catalogue.ts';
import { user } from './auth.ts';
import { stackPlans } from './plans.ts';
import { warehouses } from './stock.ts';

const statusList = sql.raw(JOB_STATUSES.map((s) => `'${s}'`).join(', '));

/** A customer's job: what they ordered for one site, and how far the wholesaler has got with it. */
export const jobs = pgTable(
  'jobs',
  {
    id: uuid().primaryKey().defaultRandom(),
    companyId: uuid()
      .notNull()
      .references(() => companies.id),
    reference: text().notNull(),
    status: text({ enum: JOB_STATUSES }).notNull().default('draft'),
    siteSuburb: text(),
    sitePostcode: text(),
    contact: text(),
    notes: text(),
    preferredWarehouseId: uuid().references(() => warehouses.id),
    /** Set once the plans' BOM lines have been copied in (at ordering, or when a quote is held). */
    linesCopiedAt: timestamp({ withTimezone: true }),
    orderedAt: timestamp({ withTimezone: true }),
    createdBy: text()
      .notNull()
      .references(() => user.id),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    unique('jobs_company_reference').on(t.companyId, t.reference),
    index().on(t.status, t.createdAt),
    index().on(t.createdAt),
    check('jobs_status_known', sql`${t.status} in (${statusList})`),
  ],
);

/** The saved plans a job was made from. */
export const jobPlans = pgTable(
  'job_plans',
  {
    jobId: uuid()
      .notNull()
      .references(() => jobs.id, { onDelete: 'cascade' }),
    planId: uuid()
      .notNull()
      .references(() => stackPlans.id),
  },
  (t) => [primaryKey({ columns: [t.jobId, t.planId] })],
);

/** What the job needs: lines copied from a plan's BOM (with that plan) or added by SKU. */
export const jobLines = pgTable(
  'job_lines',
  {
    id: uuid().primaryKey().defaultRandom(),
    jobId: uuid()
      .notNull()
      .references(() => jobs.id, { onDelete: 'cascade' }),
    lineNo: integer().notNull(),
    partId: uuid()
      .notNull()
      .references(() => parts.id),
    qty: integer().notNull(),
    planId: uuid().references(() => stackPlans.id),
    reason: text(),
    /** The unit sell price ex GST when the line was added (list price until price tiers arrive). */
    unitPriceCents: bigint({ mode: 'number' }),
  },
  (t) => [unique('job_lines_job_line_no').on(t.jobId, t.lineNo), index().on(t.partId), check('job_lines_qty_positive', sql`${t.qty} > 0`)],
);

/** Each status a job has been in: who moved it there and when. */
export const jobStatusHistory = pgTable(
  'job_status_history',
  {
    id: bigserial({ mode: 'number' }).primaryKey(),
    jobId: uuid()
      .notNull()
      .references(() => jobs.id, { onDelete: 'cascade' }),
    status: text({ enum: JOB_STATUSES }).notNull(),
    note: text(),
    /** Null when the system did it (a quote hold expiring, a receipt filling a backorder). */
    userId: text().references(() => user.id),
    at: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index().on(t.jobId, t.at)],
);

/**
 * Units held for a job line in one warehouse bin. The level row's `reserved` is the sum of
 * these; a hold with `expiresAt` is a quote hold that lapses unless the job is ordered.
 */
export const reservations = pgTable(
  'reservations',
  {
    id: uuid().primaryKey().defaultRandom(),
    jobLineId: uuid()
      .notNull()
      .references(() => jobLines.id, { onDelete: 'cascade' }),
    partId: uuid()
      .notNull()
      .references(() => parts.id),
    warehouseId: uuid()
      .notNull()
      .references(() => warehouses.id),
    bin: text().notNull(),
    qty: integer().notNull(),
    /** Held outside the job's preferred warehouse: it has to be transferred before picking. */
    needsTransfer: boolean().notNull().default(false),
    expiresAt: timestamp({ withTimezone: true }),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    unique('reservations_line_place').on(t.jobLineId, t.warehouseId, t.bin),
    index().on(t.partId, t.warehouseId, t.bin),
    index().on(t.expiresAt),
    check('reservations_qty_positive', sql`${t.qty} > 0`),
  ],
);

/** What an ordered job is still waiting for; receipts fill them oldest first (created_at, id). */
export const backorders = pgTable(
  'backorders',
  {
    id: bigserial({ mode: 'number' }).primaryKey(),
    jobLineId: uuid()
      .notNull()
      .unique()
      .references(() => jobLines.id, { onDelete: 'cascade' }),
    partId: uuid()
      .notNull()
      .references(() => parts.id),
    qty: integer().notNull(),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index().on(t.partId, t.createdAt, t.id), check('backorders_qty_positive', sql`${t.qty} > 0`)],
);
