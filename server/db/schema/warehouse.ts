import { sql } from 'drizzle-orm';
import { bigint, bigserial, check, index, integer, pgSequence, pgTable, primaryKey, text, timestamp, unique, uuid } from 'drizzle-orm/pg-core';
import { user } from './auth.ts';
import { parts } from './catalogue.ts';
import { jobLines, jobs } from './jobs.ts';
import { warehouses } from './stock.ts';

export const PICK_SESSION_STATES = ['active', 'paused', 'done'] as const;

/** One pick per job: who is picking it now, whether it is paused, and the serialised line waiting for serials. */
export const pickSessions = pgTable(
  'pick_sessions',
  {
    jobId: uuid()
      .primaryKey()
      .references(() => jobs.id, { onDelete: 'cascade' }),
    state: text({ enum: PICK_SESSION_STATES }).notNull().default('active'),
    pickerId: text().references(() => user.id),
    /** The serialised line the last part scan named: codes that are not parts are its serials. */
    currentLineId: uuid().references(() => jobLines.id, { onDelete: 'set null' }),
    startedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    pausedAt: timestamp({ withTimezone: true }),
    completedAt: timestamp({ withTimezone: true }),
    completedBy: text().references(() => user.id),
    updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [check('pick_sessions_state_known', sql`${t.state} in ('active', 'paused', 'done')`)],
);

/**
 * Accepted scans. The scan id is made on the device, so a scan replayed from an offline queue
 * (or sent twice on a flaky link) is applied once: the unique key answers the second arrival.
 */
export const pickScans = pgTable(
  'pick_scans',
  {
    id: bigserial({ mode: 'number' }).primaryKey(),
    jobId: uuid()
      .notNull()
      .references(() => jobs.id, { onDelete: 'cascade' }),
    scanId: text().notNull(),
    code: text().notNull(),
    jobLineId: uuid()
      .notNull()
      .references(() => jobLines.id, { onDelete: 'cascade' }),
    qty: integer().notNull(),
    serial: text(),
    message: text().notNull(),
    userId: text().references(() => user.id),
    at: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    unique('pick_scans_job_scan').on(t.jobId, t.scanId),
    // A serial is captured once per job (the issue table keeps it unique per part across jobs).
    unique('pick_scans_job_line_serial').on(t.jobLineId, t.serial),
    index().on(t.jobId, t.id),
    check('pick_scans_qty_positive', sql`${t.qty} > 0`),
  ],
);

export const SERIAL_STATES = ['in-stock', 'issued'] as const;

/**
 * Units of serialised parts by the maker's serial number: received into a bin, then issued to a
 * job line when its pick completes. Unique per part, so one serial can never go out twice.
 */
export const partSerials = pgTable(
  'part_serials',
  {
    id: bigserial({ mode: 'number' }).primaryKey(),
    partId: uuid()
      .notNull()
      .references(() => parts.id),
    serial: text().notNull(),
    state: text({ enum: SERIAL_STATES }).notNull(),
    warehouseId: uuid().references(() => warehouses.id),
    bin: text(),
    /** The receipt that brought it in (null for units first seen at picking). */
    receiptReference: text(),
    jobId: uuid().references(() => jobs.id),
    jobLineId: uuid().references(() => jobLines.id),
    receivedAt: timestamp({ withTimezone: true }),
    issuedAt: timestamp({ withTimezone: true }),
    issuedBy: text().references(() => user.id),
  },
  (t) => [
    unique('part_serials_part_serial').on(t.partId, t.serial),
    index().on(t.jobId),
    check('part_serials_state_known', sql`${t.state} in ('in-stock', 'issued')`),
    check('part_serials_issued_to_line', sql`${t.state} <> 'issued' or ${t.jobLineId} is not null`),
  ],
);

/** Serial references for SSCCs: one database sequence, so two label runs never share a number. */
export const ssccSerialSequence = pgSequence('sscc_serial_reference', { startWith: 1, minValue: 1 });

/** A job's parcels (kit labels): each has its SSCC, fixed the first time the kit is labelled. */
export const jobParcels = pgTable(
  'job_parcels',
  {
    jobId: uuid()
      .notNull()
      .references(() => jobs.id, { onDelete: 'cascade' }),
    n: integer().notNull(),
    of: integer().notNull(),
    sscc: text().notNull().unique(),
    serialReference: bigint({ mode: 'number' }).notNull(),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [primaryKey({ columns: [t.jobId, t.n] }), check('job_parcels_sscc_digits', sql`${t.sscc} ~ '^[0-9]{18}$'`)],
);
