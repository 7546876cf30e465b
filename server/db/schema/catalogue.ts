import { sql } from 'drizzle-orm';
import { type AnyPgColumn, bigint, check, index, integer, jsonb, numeric, pgTable, primaryKey, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import { CATEGORY_CODES } from '../../../shared/contracts/part-attributes.ts';
import { attributeShapeCheck, gtinCheckDigit } from './part-checks.ts';

const categoryList = sql.raw(CATEGORY_CODES.map((c) => `'${c}'`).join(', '));

export const makers = pgTable('makers', {
  id: uuid().primaryKey().defaultRandom(),
  code: text().notNull().unique(),
  name: text().notNull(),
  country: text(),
});

export const suppliers = pgTable(
  'suppliers',
  {
    id: uuid().primaryKey().defaultRandom(),
    code: text().notNull().unique(),
    name: text().notNull(),
    /** ISO 4217 code the supplier invoices in; costs are converted to AUD with `audPerUnit` on import. */
    currency: text().notNull().default('AUD'),
    audPerUnit: numeric({ precision: 12, scale: 6 }).notNull().default('1'),
    /** How the supplier writes numbers in its files (see shared/domain/price-list.ts NUMBER_LOCALES). */
    numberLocale: text().notNull().default('en-AU'),
    leadTimeDays: integer().notNull().default(7),
    contactName: text(),
    contactEmail: text(),
    contactPhone: text(),
    /** A cost change larger than this (either way) is flagged in an import's diff. */
    flagChangePct: numeric({ precision: 6, scale: 2 }).notNull().default('10'),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    check('suppliers_rate_positive', sql`${t.audPerUnit} > 0`),
    check('suppliers_lead_time_range', sql`${t.leadTimeDays} >= 0 and ${t.leadTimeDays} <= 365`),
    check('suppliers_flag_range', sql`${t.flagChangePct} >= 0 and ${t.flagChangePct} <= 1000`),
  ],
);

export const parts = pgTable(
  'parts',
  {
    id: uuid().primaryKey().defaultRandom(),
    sku: text().notNull().unique(),
    name: text().notNull(),
    category: text().notNull(),
    makerId: uuid()
      .notNull()
      .references(() => makers.id),
    description: text().notNull().default(''),
    gtin: text(),
    /** The GTIN as 14 digits, so a scanned GTIN-13 or GTIN-14 finds the part through one index. */
    gtin14: text().generatedAlwaysAs(sql`lpad(gtin, 14, '0')`),
    unit: text().notNull().default('each'),
    packSize: integer().notNull().default(1),
    massKg: numeric({ precision: 9, scale: 3, mode: 'number' }).notNull().default(0),
    widthMm: integer(),
    heightMm: integer(),
    depthMm: integer(),
    ipRating: text(),
    lifecycle: text({ enum: ['active', 'superseded', 'discontinued'] }).notNull().default('active'),
    supersededById: uuid().references((): AnyPgColumn => parts.id),
    unNumber: text(),
    dgClass: text(),
    whRating: numeric({ precision: 10, scale: 2, mode: 'number' }),
    /** Cents with up to two further decimals (a cost of $12.3456 is 1234.56). */
    costCents: numeric({ precision: 14, scale: 2, mode: 'number' }),
    listPriceCents: bigint({ mode: 'number' }),
    attributes: jsonb().notNull(),
    compliance: jsonb(),
    archivedAt: timestamp({ withTimezone: true }),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index().on(t.category),
    index().on(t.makerId),
    // Unique as GTIN-14, so one item cannot sit on two parts as GTIN-13 and GTIN-14.
    uniqueIndex('parts_gtin14_unique').on(t.gtin14),
    check('parts_category_known', sql`${t.category} in (${categoryList})`),
    // The typed attributes (validated by the shared zod union) must describe the same category.
    check('parts_attributes_category', sql`${t.attributes}->>'category' = ${t.category}`),
    check('parts_pack_size_positive', sql`${t.packSize} >= 1`),
    check('parts_mass_nonnegative', sql`${t.massKg} >= 0`),
    check('parts_gtin_digits', sql`${t.gtin} ~ '^([0-9]{8}|[0-9]{12}|[0-9]{13}|[0-9]{14})$'`),
    check('parts_gtin_check_digit', sql`${t.gtin} is null or ${gtinCheckDigit(t.gtin)}`),
    check('parts_attributes_shape', attributeShapeCheck(t.category, t.attributes)),
    check('parts_superseded_has_successor', sql`${t.lifecycle} <> 'superseded' or ${t.supersededById} is not null`),
    check('parts_money_nonnegative', sql`coalesce(${t.costCents}, 0) >= 0 and coalesce(${t.listPriceCents}, 0) >= 0`),
  ],
);

export const partSupplierSkus = pgTable(
  'part_supplier_skus',
  {
    partId: uuid()
      .notNull()
      .references(() => parts.id, { onDelete: 'cascade' }),
    supplierId: uuid()
      .notNull()
      .references(() => suppliers.id),
    supplierSku: text().notNull(),
    /** The supplier's description, as in its last price list. */
    description: text(),
    /** Units of our part in one of the supplier's packs; orders are whole packs. */
    packSize: integer().notNull().default(1),
    /** Minimum order quantity, in units. */
    moq: integer().notNull().default(1),
    /** Cost per unit in AUD cents with up to two further decimals (4-dp costs), at quantity 1. */
    costCents: numeric({ precision: 14, scale: 2, mode: 'number' }),
    /** Cheaper unit costs from a quantity up: [{ minQty, costCents }], ascending by minQty. */
    priceBreaks: jsonb().$type<{ minQty: number; costCents: number }[]>().notNull().default([]),
    /** The supplier's recommended sell price per unit ex GST, cents, when its list gives one. */
    listPriceCents: bigint({ mode: 'number' }),
    /** Overrides the supplier's lead time for this part. */
    leadTimeDays: integer(),
    updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    primaryKey({ columns: [t.partId, t.supplierId] }),
    check('part_supplier_skus_pack_positive', sql`${t.packSize} >= 1 and ${t.moq} >= 1`),
    check('part_supplier_skus_money_nonnegative', sql`coalesce(${t.costCents}, 0) >= 0 and coalesce(${t.listPriceCents}, 0) >= 0`),
    uniqueIndex().on(t.supplierId, t.supplierSku),
    index('part_supplier_skus_upper_idx').on(sql`upper(${t.supplierSku})`),
  ],
);

export const partMedia = pgTable(
  'part_media',
  {
    id: uuid().primaryKey().defaultRandom(),
    partId: uuid()
      .notNull()
      .references(() => parts.id, { onDelete: 'cascade' }),
    kind: text({ enum: ['image', 'datasheet'] }).notNull(),
    contentType: text().notNull(),
    fileName: text().notNull(),
    bytes: integer().notNull(),
    storageKey: text().notNull(),
    thumbnailKey: text(),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index().on(t.partId)],
);

export const ranges = pgTable(
  'ranges',
  {
    id: uuid().primaryKey().defaultRandom(),
    code: text().notNull().unique(),
    name: text().notNull(),
    makerId: uuid()
      .notNull()
      .references(() => makers.id),
    connection: text({ enum: ['series', 'parallel'] }).notNull(),
    controllerId: uuid()
      .notNull()
      .references(() => parts.id),
    moduleId: uuid()
      .notNull()
      .references(() => parts.id),
    minModules: integer().notNull(),
    maxModules: integer().notNull(),
    maxStacks: integer().notNull().default(1),
    baseHeightMm: integer().notNull().default(0),
    defaultDodPct: numeric({ precision: 5, scale: 2, mode: 'number' }),
    /** BOM rules as data, validated by BomRulesSchema (shared/domain/bom-rules.ts). */
    rules: jsonb().notNull().default([]),
    updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    check('ranges_modules_order', sql`${t.minModules} >= 1 and ${t.maxModules} >= ${t.minModules} and ${t.maxModules} <= 64`),
    check('ranges_stacks_positive', sql`${t.maxStacks} >= 1`),
  ],
);

export const rangeInverters = pgTable(
  'range_inverters',
  {
    rangeId: uuid()
      .notNull()
      .references(() => ranges.id, { onDelete: 'cascade' }),
    inverterId: uuid()
      .notNull()
      .references(() => parts.id),
  },
  (t) => [primaryKey({ columns: [t.rangeId, t.inverterId] })],
);
