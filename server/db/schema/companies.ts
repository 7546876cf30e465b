import { sql } from 'drizzle-orm';
import { type AnyPgColumn, check, jsonb, numeric, pgTable, text, timestamp, unique, uuid } from 'drizzle-orm/pg-core';

/** The wholesaler itself and its customer accounts (installer companies). */
export const companies = pgTable(
  'companies',
  {
    id: uuid().primaryKey().defaultRandom(),
    name: text().notNull().unique(),
    kind: text({ enum: ['wholesaler', 'installer'] }).notNull(),
    abn: text(),
    accountType: text({ enum: ['trade', 'cash'] }).notNull().default('trade'),
    tierDiscountPct: numeric({ precision: 5, scale: 2 }).notNull().default('0'),
    /** The customer's price tier; its discount wins over `tierDiscountPct` when set. */
    tierId: uuid().references((): AnyPgColumn => customerTiers.id),
    suburb: text(),
    postcode: text(),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    check('companies_kind_check', sql`${t.kind} in ('wholesaler', 'installer')`),
    check('companies_discount_range', sql`${t.tierDiscountPct} >= 0 and ${t.tierDiscountPct} < 100`),
    // The target of user_company_kind_fk: a user's company and the kind their role needs, together.
    unique('companies_id_kind').on(t.id, t.kind),
  ],
);

/** Key/value settings (tax, currency, label and seed markers); values are validated where they are read. */
export const settings = pgTable('settings', {
  key: text().primaryKey(),
  value: jsonb().notNull(),
  updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
});

/** Price tiers for customer accounts: a discount off the sell price list (purchasing sets them). */
export const customerTiers = pgTable(
  'customer_tiers',
  {
    id: uuid().primaryKey().defaultRandom(),
    code: text().notNull().unique(),
    name: text().notNull(),
    discountPct: numeric({ precision: 5, scale: 2 }).notNull().default('0'),
  },
  (t) => [check('customer_tiers_discount_range', sql`${t.discountPct} >= 0 and ${t.discountPct} < 100`)],
);
