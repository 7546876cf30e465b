import { sql } from 'drizzle-orm';
import { bigint, bigserial, boolean, check, customType, index, integer, jsonb, numeric, pgTable, primaryKey, text, timestamp, unique, uuid } from 'drizzle-orm/pg-core';
import { parts, suppliers } from './catalogue.ts';
import { user } from './auth.ts';
import { warehouses } from './stock.ts';
import { IMPORT_STATUSES, PO_STATUSES, PRICE_BASES, type ColumnMapping, type PriceBreak, type RowProblem } from '../../../shared/contracts/purchasing.ts';

const bytea = customType<{ data: Buffer; driverData: Buffer }>({ dataType: () => 'bytea' });
const list = (values: readonly string[]) => sql.raw(values.map((v) => `'${v}'`).join(', '));

/** Every cost a supplier part has had: one row per change (import or manual), newest last. */
export const supplierPartPrices = pgTable(
  'supplier_part_prices',
  {
    id: bigserial({ mode: 'number' }).primaryKey(),
    partId: uuid()
      .notNull()
      .references(() => parts.id, { onDelete: 'cascade' }),
    supplierId: uuid()
      .notNull()
      .references(() => suppliers.id),
    costCents: numeric({ precision: 14, scale: 2, mode: 'number' }).notNull(),
    priceBreaks: jsonb().$type<PriceBreak[]>().notNull().default([]),
    importId: uuid().references(() => priceListImports.id),
    userId: text().references(() => user.id),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index().on(t.partId, t.supplierId, t.createdAt)],
);

/** The column mapping each supplier's files were last imported with, offered again next time. */
export const supplierImportMappings = pgTable('supplier_import_mappings', {
  supplierId: uuid()
    .primaryKey()
    .references(() => suppliers.id),
  headers: jsonb().$type<string[]>().notNull(),
  mapping: jsonb().$type<ColumnMapping>().notNull(),
  updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
});

/**
 * One uploaded price list: the file itself (so the mapping or sheet can change without a second
 * upload), its mapping, the staged rows' counts and, once applied, who applied it and when.
 */
export const priceListImports = pgTable(
  'price_list_imports',
  {
    id: uuid().primaryKey().defaultRandom(),
    supplierId: uuid()
      .notNull()
      .references(() => suppliers.id),
    fileName: text().notNull(),
    fileHash: text().notNull(),
    fileKind: text({ enum: ['csv', 'xlsx'] }).notNull(),
    file: bytea().notNull(),
    sheets: jsonb().$type<string[]>().notNull().default([]),
    sheet: text(),
    columns: jsonb().$type<string[]>().notNull().default([]),
    mapping: jsonb().$type<ColumnMapping>().notNull().default({}),
    status: text({ enum: IMPORT_STATUSES }).notNull().default('uploaded'),
    counts: jsonb().$type<Record<string, number>>().notNull().default({}),
    /** Rows done / rows in all while staging or applying, for the progress bar. */
    progressDone: integer().notNull().default(0),
    progressTotal: integer().notNull().default(0),
    createdBy: text().references(() => user.id),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    appliedBy: text().references(() => user.id),
    appliedAt: timestamp({ withTimezone: true }),
  },
  (t) => [index().on(t.supplierId, t.createdAt), index().on(t.fileHash), check('price_list_imports_status_known', sql`${t.status} in (${list(IMPORT_STATUSES)})`)],
);

/** The rows of an import as parsed with its mapping: what preview shows and apply writes. */
export const priceListRows = pgTable(
  'price_list_rows',
  {
    importId: uuid()
      .notNull()
      .references(() => priceListImports.id, { onDelete: 'cascade' }),
    /** The row's number in the file as a spreadsheet shows it (the header is row 1). */
    rowNo: integer().notNull(),
    supplierSku: text(),
    gtin: text(),
    description: text(),
    costCents: numeric({ precision: 14, scale: 2, mode: 'number' }),
    listPriceCents: bigint({ mode: 'number' }),
    packSize: integer(),
    moq: integer(),
    leadTimeDays: integer(),
    priceBreaks: jsonb().$type<PriceBreak[]>().notNull().default([]),
    problems: jsonb().$type<RowProblem[]>().notNull().default([]),
    partId: uuid().references(() => parts.id, { onDelete: 'set null' }),
    matchedBy: text({ enum: ['supplier-sku', 'gtin', 'linked'] }),
    /** Create a part from this row on apply: { category, maker }. */
    createAs: jsonb().$type<{ category: string; maker: string; sku: string }>(),
    oldCostCents: numeric({ precision: 14, scale: 2, mode: 'number' }),
    kind: text({ enum: ['error', 'new', 'changed', 'unchanged'] }).notNull(),
    flagged: boolean().notNull().default(false),
  },
  (t) => [
    primaryKey({ columns: [t.importId, t.rowNo] }),
    index().on(t.importId, t.kind),
    // "Missing from this file" looks each of the supplier's parts up here by SKU, any case.
    index('price_list_rows_import_upper_sku_idx').on(t.importId, sql`upper(${t.supplierSku})`),
  ],
);

/** Sell price basis per category: cost plus markup, or the supplier's recommended list price. */
export const pricingRules = pgTable(
  'pricing_rules',
  {
    category: text().primaryKey(),
    basis: text({ enum: PRICE_BASES }).notNull().default('markup'),
    markupPct: numeric({ precision: 7, scale: 2 }).notNull().default('30'),
    updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [check('pricing_rules_markup_range', sql`${t.markupPct} >= 0 and ${t.markupPct} <= 1000`), check('pricing_rules_basis_known', sql`${t.basis} in (${list(PRICE_BASES)})`)],
);

/** A part's own pricing, overriding its category's rule. */
export const partPricing = pgTable(
  'part_pricing',
  {
    partId: uuid()
      .primaryKey()
      .references(() => parts.id, { onDelete: 'cascade' }),
    basis: text({ enum: PRICE_BASES }).notNull(),
    markupPct: numeric({ precision: 7, scale: 2 }),
    updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [check('part_pricing_markup_range', sql`${t.markupPct} is null or (${t.markupPct} >= 0 and ${t.markupPct} <= 1000)`), check('part_pricing_basis_known', sql`${t.basis} in (${list(PRICE_BASES)})`)],
);

/** One recompute of sell prices (after an import, a rule change or by hand) and what it moved. */
export const priceRecomputes = pgTable('price_recomputes', {
  id: uuid().primaryKey().defaultRandom(),
  reason: text().notNull(),
  importId: uuid().references(() => priceListImports.id),
  userId: text().references(() => user.id),
  moved: integer().notNull().default(0),
  createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
});

export const priceMoves = pgTable(
  'price_moves',
  {
    recomputeId: uuid()
      .notNull()
      .references(() => priceRecomputes.id, { onDelete: 'cascade' }),
    partId: uuid()
      .notNull()
      .references(() => parts.id, { onDelete: 'cascade' }),
    oldCents: bigint({ mode: 'number' }),
    newCents: bigint({ mode: 'number' }).notNull(),
  },
  (t) => [primaryKey({ columns: [t.recomputeId, t.partId] })],
);

export const purchaseOrders = pgTable(
  'purchase_orders',
  {
    id: uuid().primaryKey().defaultRandom(),
    number: text().notNull().unique(),
    supplierId: uuid()
      .notNull()
      .references(() => suppliers.id),
    warehouseId: uuid()
      .notNull()
      .references(() => warehouses.id),
    status: text({ enum: PO_STATUSES }).notNull().default('draft'),
    note: text(),
    expectedAt: timestamp({ withTimezone: true }),
    createdBy: text().references(() => user.id),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    sentAt: timestamp({ withTimezone: true }),
    closedAt: timestamp({ withTimezone: true }),
  },
  (t) => [index().on(t.status, t.createdAt), check('purchase_orders_status_known', sql`${t.status} in (${list(PO_STATUSES)})`)],
);

export const purchaseOrderLines = pgTable(
  'purchase_order_lines',
  {
    id: uuid().primaryKey().defaultRandom(),
    purchaseOrderId: uuid()
      .notNull()
      .references(() => purchaseOrders.id, { onDelete: 'cascade' }),
    lineNo: integer().notNull(),
    partId: uuid()
      .notNull()
      .references(() => parts.id),
    supplierSku: text().notNull(),
    qty: integer().notNull(),
    received: integer().notNull().default(0),
    /** Unit cost in cents (4-dp costs carry two further decimals), fixed when the line was made. */
    unitCostCents: numeric({ precision: 14, scale: 2, mode: 'number' }).notNull(),
  },
  (t) => [
    unique('purchase_order_lines_no').on(t.purchaseOrderId, t.lineNo),
    index().on(t.partId),
    check('purchase_order_lines_qty_positive', sql`${t.qty} > 0`),
    check('purchase_order_lines_received_range', sql`${t.received} >= 0 and ${t.received} <= ${t.qty}`),
  ],
);
