import { sql } from 'drizzle-orm';
import { check, index, integer, pgTable, primaryKey, text, timestamp, uuid, bigserial } from 'drizzle-orm/pg-core';
import { parts } from './catalogue.ts';
import { user } from './auth.ts';

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
    kind: text({ enum: ['receive', 'adjust', 'transfer-out', 'transfer-in', 'pick-issue', 'return', 'count-correction'] }).notNull(),
    reason: text(),
    userId: text().references(() => user.id),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index().on(t.partId, t.warehouseId), check('stock_movement_nonzero', sql`${t.qty} <> 0`)],
);
