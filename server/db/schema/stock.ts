import { sql } from 'drizzle-orm';
import { type AnyPgColumn, check, index, integer, pgTable, primaryKey, text, timestamp, uuid, bigserial, unique } from 'drizzle-orm/pg-core';
import { parts } from './catalogue.ts';
import { user } from './auth.ts';
import { jobs } from './jobs.ts';
import { MOVEMENT_KINDS } from '../../../shared/contracts/stock.ts';

export const warehouses = pgTable('warehouses', {
  id: uuid().primaryKey().defaultRandom(),
  code: text().notNull().unique(),
  name: text().notNull(),
  /** Lower ranks are tried first when reserving. */
  rank: integer().notNull().default(1),
});

/**
 * Stock per part × warehouse × bin, kept in step with the ledger in the same transaction.
 * The database itself forbids negative stock and reserving more than is on hand.
 */
export const stockLevels = pgTable(
  'stock_levels',
  {
    partId: uuid()
      .notNull()
      .references(() => parts.id),
    warehouseId: uuid()
      .notNull()
      .references(() => warehouses.id),
    bin: text().notNull(),
    onHand: integer().notNull().default(0),
    reserved: integer().notNull().default(0),
    updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    primaryKey({ columns: [t.partId, t.warehouseId, t.bin] }),
    check('stock_on_hand_nonnegative', sql`${t.onHand} >= 0`),
    check('stock_reserved_within_on_hand', sql`${t.reserved} >= 0 and ${t.reserved} <= ${t.onHand}`),
  ],
);

/** The stock ledger: immutable movements; the truth that stock levels summarise. */
export const stockMovements = pgTable(
  'stock_movements',
  {
    id: bigserial({ mode: 'number' }).primaryKey(),
    partId: uuid()
      .notNull()
      .references(() => parts.id),
    warehouseId: uuid()
      .notNull()
      .references(() => warehouses.id),
    bin: text().notNull(),
    qty: integer().notNull(),
    kind: text({ enum: MOVEMENT_KINDS }).notNull(),
    reason: text(),
    /** What the movement belongs to: a receipt or transfer number (shared by a transfer's out and in), or the job's reference. */
    reference: text(),
    jobId: uuid().references((): AnyPgColumn => jobs.id),
    userId: text().references(() => user.id),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index().on(t.partId, t.warehouseId),
    index().on(t.createdAt),
    index().on(t.jobId),
    check('stock_movement_nonzero', sql`${t.qty} <> 0`),
    check('stock_movement_kind_known', sql`${t.kind} in (${sql.raw(MOVEMENT_KINDS.map((k) => `'${k}'`).join(', '))})`),
  ],
);

/** Bins within a warehouse; pickers walk them in pick order. */
export const bins = pgTable(
  'bins',
  {
    id: uuid().primaryKey().defaultRandom(),
    warehouseId: uuid()
      .notNull()
      .references(() => warehouses.id),
    code: text().notNull(),
    pickOrder: integer().notNull().default(0),
  },
  (t) => [unique('bins_warehouse_code').on(t.warehouseId, t.code), check('bins_pick_order_nonnegative', sql`${t.pickOrder} >= 0`)],
);

/** Where a part lives in a warehouse by default: receipts and reservations go there first. */
export const defaultBins = pgTable(
  'default_bins',
  {
    partId: uuid()
      .notNull()
      .references(() => parts.id),
    warehouseId: uuid()
      .notNull()
      .references(() => warehouses.id),
    bin: text().notNull(),
  },
  (t) => [primaryKey({ columns: [t.partId, t.warehouseId] })],
);

/** Per-part minimum and maximum stock (all warehouses together), for the low-stock view and reordering. */
export const stockLimits = pgTable(
  'stock_limits',
  {
    partId: uuid()
      .primaryKey()
      .references(() => parts.id),
    minQty: integer().notNull(),
    maxQty: integer().notNull(),
    updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [check('stock_limits_order', sql`${t.minQty} >= 0 and ${t.maxQty} >= ${t.minQty}`)],
);
