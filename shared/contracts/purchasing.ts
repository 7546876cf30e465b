import { z } from 'zod';
import { text } from './text.ts';
import { CATEGORY_CODES } from './part-attributes.ts';
import { SerialSchema } from './stock.ts';

export const IMPORT_STATUSES = ['uploaded', 'staging', 'ready', 'applying', 'applied', 'failed'] as const;
export type ImportStatus = (typeof IMPORT_STATUSES)[number];
export const IMPORT_STATUS_LABELS: Record<ImportStatus, string> = {
  uploaded: 'Needs its columns',
  staging: 'Reading rows',
  ready: 'Ready to check',
  applying: 'Applying',
  applied: 'Applied',
  failed: 'Could not be read',
};

export const PO_STATUSES = ['draft', 'sent', 'part-received', 'received', 'closed'] as const;
export type PoStatus = (typeof PO_STATUSES)[number];
export const PO_STATUS_LABELS: Record<PoStatus, string> = {
  draft: 'Draft',
  sent: 'Sent',
  'part-received': 'Part received',
  received: 'Received',
  closed: 'Closed',
};

/** How a sell price is found: cost plus markup, or the supplier's recommended list price. */
export const PRICE_BASES = ['markup', 'supplier-list'] as const;
export type PriceBasis = (typeof PRICE_BASES)[number];

/** Our fields a price-list column can fill. `supplierSku` and `cost` are required. */
export const IMPORT_FIELDS = ['supplierSku', 'cost', 'description', 'gtin', 'packSize', 'moq', 'leadTimeDays', 'listPrice', 'break1Qty', 'break1Cost', 'break2Qty', 'break2Cost', 'break3Qty', 'break3Cost'] as const;
export type ImportField = (typeof IMPORT_FIELDS)[number];
export const REQUIRED_IMPORT_FIELDS: readonly ImportField[] = ['supplierSku', 'cost'];
export const IMPORT_FIELD_LABELS: Record<ImportField, string> = {
  supplierSku: 'Supplier SKU',
  cost: 'Cost (unit, ex GST)',
  description: 'Description',
  gtin: 'GTIN',
  packSize: 'Pack size',
  moq: 'Minimum order qty',
  leadTimeDays: 'Lead time (days)',
  listPrice: 'Recommended sell price',
  break1Qty: 'Break 1 from qty',
  break1Cost: 'Break 1 cost',
  break2Qty: 'Break 2 from qty',
  break2Cost: 'Break 2 cost',
  break3Qty: 'Break 3 from qty',
  break3Cost: 'Break 3 cost',
};

/** Our field → the file's column header. */
export type ColumnMapping = Partial<Record<ImportField, string>>;
export const ColumnMappingSchema = z.partialRecord(z.enum(IMPORT_FIELDS), text().max(200));

export interface PriceBreak {
  minQty: number;
  costCents: number;
}
export interface RowProblem {
  column: string | null;
  message: string;
}

export const NUMBER_LOCALES = ['en-AU', 'de-DE', 'fr-FR'] as const;
export type NumberLocale = (typeof NUMBER_LOCALES)[number];
export const NUMBER_LOCALE_LABELS: Record<NumberLocale, string> = {
  'en-AU': '1,234.50 (point for decimals)',
  'de-DE': '1.234,50 (comma for decimals, point groups)',
  'fr-FR': '1 234,50 (comma for decimals, space groups)',
};

const money = z.number().min(0).max(100_000_000);
const pct = z.number().min(0).max(1000);
const name = text().trim().min(1, 'Give a name.').max(120);

export const SupplierInputSchema = z.strictObject({
  code: text().trim().toUpperCase().regex(/^[A-Z0-9-]{2,16}$/, 'Use 2–16 letters, digits or dashes.'),
  name,
  currency: text().trim().toUpperCase().regex(/^[A-Z]{3}$/, 'A three-letter currency code, e.g. AUD.').default('AUD'),
  audPerUnit: z.number().positive('The rate must be above 0.').max(100_000).default(1),
  numberLocale: z.enum(NUMBER_LOCALES).default('en-AU'),
  leadTimeDays: z.number().int().min(0).max(365).default(7),
  contactName: text().trim().max(120).nullable().optional(),
  contactEmail: z.email('Give an e-mail address.').max(200).nullable().optional(),
  contactPhone: text().trim().max(40).nullable().optional(),
  flagChangePct: pct.default(10),
});
export type SupplierInput = z.infer<typeof SupplierInputSchema>;

export const SupplierSchema = z.object({
  id: text(),
  code: text(),
  name: text(),
  currency: text(),
  audPerUnit: z.number(),
  numberLocale: z.enum(NUMBER_LOCALES),
  leadTimeDays: z.number(),
  contactName: text().nullable(),
  contactEmail: text().nullable(),
  contactPhone: text().nullable(),
  flagChangePct: z.number(),
  parts: z.number(),
  lastImportAt: text().nullable(),
});
export type Supplier = z.infer<typeof SupplierSchema>;

export const PriceBreakSchema = z.object({ minQty: z.number().int().min(2).max(1_000_000), costCents: money });

export const SupplierPartSchema = z.object({
  sku: text(),
  name: text(),
  supplierSku: text(),
  description: text().nullable(),
  packSize: z.number(),
  moq: z.number(),
  costCents: z.number().nullable(),
  priceBreaks: z.array(PriceBreakSchema),
  listPriceCents: z.number().nullable(),
  leadTimeDays: z.number().nullable(),
  updatedAt: text(),
});
export type SupplierPart = z.infer<typeof SupplierPartSchema>;

export const SupplierPartInputSchema = z.strictObject({
  sku: text().trim().min(1, 'Give our SKU.').max(64).toUpperCase(),
  supplierSku: text().trim().min(1, 'Give the supplier’s SKU.').max(64),
  description: text().trim().max(300).nullable().optional(),
  packSize: z.number().int().min(1).max(100_000).default(1),
  moq: z.number().int().min(1).max(1_000_000).default(1),
  costCents: money.multipleOf(0.01, 'Cost carries at most 4 decimals of a dollar.').nullable().optional(),
  priceBreaks: z
    .array(PriceBreakSchema)
    .max(10)
    .default([])
    .refine((b) => b.every((x, i) => i === 0 || x.minQty > b[i - 1]!.minQty), 'List price breaks from the smallest quantity up, each quantity once.'),
  listPriceCents: z.number().int().min(0).max(100_000_000).nullable().optional(),
  leadTimeDays: z.number().int().min(0).max(365).nullable().optional(),
});
export type SupplierPartInput = z.infer<typeof SupplierPartInputSchema>;

export const PriceHistorySchema = z.object({ at: text(), costCents: z.number(), priceBreaks: z.array(PriceBreakSchema), importId: text().nullable(), by: text().nullable() });

export const PriceListSchema = z.object({
  id: text(),
  supplier: z.object({ id: text(), code: text(), name: text() }),
  fileName: text(),
  fileHash: text(),
  fileKind: z.enum(['csv', 'xlsx']),
  sheets: z.array(text()),
  sheet: text().nullable(),
  status: z.enum(IMPORT_STATUSES),
  columns: z.array(text()),
  mapping: ColumnMappingSchema,
  counts: z.record(text(), z.number()),
  progress: z.object({ done: z.number(), total: z.number() }),
  createdAt: text(),
  createdBy: text().nullable(),
  appliedAt: text().nullable(),
  appliedBy: text().nullable(),
  /** Set when this very file was applied for the supplier before. */
  sameFileAppliedAt: text().nullable(),
});
export type PriceList = z.infer<typeof PriceListSchema>;

export const PriceListMappingSchema = z.strictObject({
  mapping: ColumnMappingSchema,
  sheet: text().max(200).optional(),
});
export type PriceListMappingInput = z.infer<typeof PriceListMappingSchema>;

export const PreviewQuerySchema = z.object({
  kind: z.enum(['all', 'new', 'changed', 'unchanged', 'missing', 'error', 'flagged']).default('all'),
  page: z.coerce.number().int().min(1).max(100_000).default(1),
  pageSize: z.coerce.number().int().min(1).max(500).default(100),
});
export type PreviewQuery = z.infer<typeof PreviewQuerySchema>;

export const PreviewCountsSchema = z.object({ rows: z.number(), ok: z.number(), errors: z.number(), new: z.number(), changed: z.number(), unchanged: z.number(), missing: z.number(), flagged: z.number(), unlinked: z.number() });
export type PreviewCounts = z.infer<typeof PreviewCountsSchema>;

export const PreviewChangeSchema = z.object({
  row: z.number().nullable(),
  kind: z.enum(['new', 'changed', 'unchanged', 'missing']),
  supplierSku: text(),
  description: text().nullable(),
  sku: text().nullable(),
  matchedBy: text().nullable(),
  createAs: z.object({ category: text(), maker: text(), sku: text() }).nullable(),
  oldCostCents: z.number().nullable(),
  newCostCents: z.number().nullable(),
  changePct: z.number().nullable(),
  flagged: z.boolean(),
});
export type PreviewChange = z.infer<typeof PreviewChangeSchema>;

export const PreviewSchema = z.object({
  counts: PreviewCountsSchema,
  errors: z.array(z.object({ row: z.number(), column: text().nullable(), message: text() })),
  changes: z.array(PreviewChangeSchema),
  total: z.number(),
});
export type Preview = z.infer<typeof PreviewSchema>;

export const RowLinkSchema = z.strictObject({
  links: z
    .array(
      z.union([
        z.strictObject({ row: z.number().int().min(2), sku: text().trim().min(1).max(64).toUpperCase() }),
        z.strictObject({ row: z.number().int().min(2), create: z.strictObject({ category: z.enum(CATEGORY_CODES), maker: text().trim().min(1).max(16).toUpperCase(), sku: text().trim().toUpperCase().regex(/^[A-Z0-9][A-Z0-9-]{1,63}$/, 'SKUs are letters, digits and dashes.') }) }),
        z.strictObject({ row: z.number().int().min(2), unlink: z.literal(true) }),
      ]),
    )
    .min(1)
    .max(1000),
});
export type RowLinkInput = z.infer<typeof RowLinkSchema>;

export const ApplyResultSchema = z.object({ applied: z.boolean(), counts: PreviewCountsSchema, pricesMoved: z.number() });

// Sell pricing

export const PricingRuleSchema = z.object({ category: z.enum(CATEGORY_CODES), basis: z.enum(PRICE_BASES), markupPct: z.number() });
export const PricingRuleInputSchema = z.strictObject({ rules: z.array(z.strictObject({ category: z.enum(CATEGORY_CODES), basis: z.enum(PRICE_BASES), markupPct: pct })).min(1).max(50) });
export const PartPricingInputSchema = z.strictObject({ basis: z.enum(PRICE_BASES).nullable(), markupPct: pct.nullable().optional() });
export const TierSchema = z.object({ id: text(), code: text(), name: text(), discountPct: z.number(), companies: z.array(z.object({ id: text(), name: text() })) });
export const TierInputSchema = z.strictObject({
  code: text().trim().toUpperCase().regex(/^[A-Z0-9-]{1,16}$/, 'Use 1–16 letters, digits or dashes.'),
  name,
  discountPct: z.number().min(0).max(99.99),
});
export const CompanyTierInputSchema = z.strictObject({ tierId: z.uuid().nullable() });
export const PriceMoveSchema = z.object({ sku: text(), name: text(), oldCents: z.number().nullable(), newCents: z.number(), changePct: z.number().nullable() });
export const RecomputeSchema = z.object({ id: text(), at: text(), reason: text(), moved: z.number(), by: text().nullable(), moves: z.array(PriceMoveSchema) });
export type Recompute = z.infer<typeof RecomputeSchema>;

// Replenishment and purchase orders

export const SuggestionSchema = z.object({
  sku: text(),
  name: text(),
  warehouse: text(),
  available: z.number(),
  backordered: z.number(),
  onOrder: z.number(),
  min: z.number(),
  max: z.number(),
  need: z.number(),
  orderQty: z.number(),
  supplier: z.object({ code: text(), name: text(), supplierSku: text(), unitCostCents: z.number(), leadTimeDays: z.number(), packSize: z.number(), moq: z.number() }).nullable(),
  why: text(),
});
export type Suggestion = z.infer<typeof SuggestionSchema>;

export const DraftFromSuggestionsSchema = z.strictObject({
  lines: z.array(z.strictObject({ sku: text().trim().min(1).max(64).toUpperCase(), qty: z.number().int().min(1).max(1_000_000) })).min(1).max(500),
});

export const PoLineSchema = z.object({ id: text(), lineNo: z.number(), sku: text(), name: text(), supplierSku: text(), qty: z.number(), received: z.number(), /** Received units each need a serial. */ serialised: z.boolean(), unitCostCents: z.number().nullable(), lineCents: z.number().nullable() });
export const PurchaseOrderSchema = z.object({
  id: text(),
  number: text(),
  status: z.enum(PO_STATUSES),
  supplier: z.object({ id: text(), code: text(), name: text(), contactEmail: text().nullable() }),
  warehouse: text(),
  note: text().nullable(),
  createdAt: text(),
  sentAt: text().nullable(),
  closedAt: text().nullable(),
  lines: z.array(PoLineSchema),
  totals: z.object({ exCents: z.number(), gstCents: z.number(), incCents: z.number() }).nullable(),
});
export type PurchaseOrder = z.infer<typeof PurchaseOrderSchema>;
export const PoSummarySchema = z.object({ id: text(), number: text(), status: z.enum(PO_STATUSES), supplier: text(), warehouse: text(), lines: z.number(), units: z.number(), received: z.number(), exCents: z.number().nullable(), createdAt: text() });
export const PoQuerySchema = z.object({ status: z.enum(PO_STATUSES).optional() });
export const PoLineInputSchema = z.strictObject({ sku: text().trim().min(1).max(64).toUpperCase(), qty: z.number().int().min(1).max(1_000_000), unitCostCents: money.multipleOf(0.01).optional() });
export const PoInputSchema = z.strictObject({
  supplier: text().trim().min(1).max(16).toUpperCase(),
  warehouse: text().trim().min(1).max(32).toUpperCase(),
  note: text().trim().max(500).nullable().optional(),
  lines: z.array(PoLineInputSchema).min(1, 'A purchase order has at least one line.').max(500),
});
export type PoInput = z.infer<typeof PoInputSchema>;
export const PoReceiptSchema = z.strictObject({
  reference: text().trim().min(1).max(64).optional(),
  /** Where lines go that name no bin and whose part has no bin in the warehouse yet (a receiving bay). */
  fallbackBin: text().trim().min(1).max(32).toUpperCase().optional(),
  lines: z.array(z.strictObject({ lineId: z.uuid(), qty: z.number().int().min(1).max(1_000_000), bin: text().trim().min(1).max(32).toUpperCase().optional(), serials: z.array(SerialSchema).max(1000).optional() })).min(1).max(500),
});
export type PoReceiptInput = z.infer<typeof PoReceiptSchema>;
