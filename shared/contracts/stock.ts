import { z } from 'zod';
import { text } from './text.ts';
import { PageQuerySchema } from './common.ts';

export const MOVEMENT_KINDS = ['receive', 'adjust', 'transfer-out', 'transfer-in', 'pick-issue', 'return', 'count-correction'] as const;
export type MovementKind = (typeof MOVEMENT_KINDS)[number];

export const MOVEMENT_KIND_LABELS: Record<MovementKind, string> = {
  receive: 'Received',
  adjust: 'Adjusted',
  'transfer-out': 'Transferred out',
  'transfer-in': 'Transferred in',
  'pick-issue': 'Issued to a job',
  return: 'Returned',
  'count-correction': 'Count correction',
};

const sku = text().trim().min(1, 'Give a SKU.').max(64).toUpperCase();
const warehouse = text().trim().min(1, 'Choose a warehouse.').max(32).toUpperCase();
const bin = text().trim().min(1, 'Give a bin.').max(32).toUpperCase();
/** Whole units: zero, negative and fractional quantities are refused where units are counted. */
export const UnitsSchema = z.number({ error: 'Give a quantity in whole units.' }).int('Quantities are whole units.').positive('The quantity must be at least 1.').max(1_000_000);

export const StockQuerySchema = z.object({
  sku: text().trim().max(64).optional(),
  warehouse: text().trim().max(32).optional(),
  page: PageQuerySchema.shape.page,
  pageSize: z.coerce.number().int().min(1).max(500).default(100),
});
export type StockQuery = z.infer<typeof StockQuerySchema>;

export const StockLevelSchema = z.object({
  sku: text(),
  name: text(),
  warehouse: text(),
  bin: text(),
  isDefaultBin: z.boolean(),
  onHand: z.number(),
  reserved: z.number(),
  available: z.number(),
  /** Units on open purchase orders (purchasing brings these; 0 until then). */
  onOrder: z.number(),
});
export type StockLevel = z.infer<typeof StockLevelSchema>;

export const MovementQuerySchema = z.object({
  sku: text().trim().max(64).optional(),
  warehouse: text().trim().max(32).optional(),
  kind: z.enum(MOVEMENT_KINDS).optional(),
  from: z.iso.date().optional(),
  to: z.iso.date().optional(),
  page: PageQuerySchema.shape.page,
  pageSize: PageQuerySchema.shape.pageSize,
});
export type MovementQuery = z.infer<typeof MovementQuerySchema>;

export const MovementSchema = z.object({
  id: z.number(),
  at: text(),
  sku: text(),
  name: text(),
  warehouse: text(),
  bin: text(),
  qty: z.number(),
  kind: z.enum(MOVEMENT_KINDS),
  reason: text().nullable(),
  reference: text().nullable(),
  job: z.object({ id: text(), reference: text() }).nullable(),
  by: text().nullable(),
});
export type Movement = z.infer<typeof MovementSchema>;

export const AdjustmentSchema = z.strictObject({
  sku,
  warehouse,
  bin: bin.optional(),
  qty: z.number({ error: 'Give the change in whole units (negative to take stock off).' }).int('Quantities are whole units.').refine((n) => n !== 0, 'An adjustment changes stock by at least 1 unit.').refine((n) => Math.abs(n) <= 1_000_000, 'That is more than any bin holds.'),
  reason: text({ error: 'Say why the stock is being adjusted.' }).trim().min(3, 'Say why the stock is being adjusted.').max(500),
});
export type AdjustmentInput = z.infer<typeof AdjustmentSchema>;

export const CountSchema = z.strictObject({
  sku,
  warehouse,
  bin,
  counted: z.number().int('Counts are whole units.').min(0, 'A count cannot be negative.').max(1_000_000),
  reason: text().trim().max(500).optional(),
});
export type CountInput = z.infer<typeof CountSchema>;

export const TransferSchema = z
  .strictObject({
    sku,
    fromWarehouse: warehouse,
    fromBin: bin.optional(),
    toWarehouse: warehouse,
    toBin: bin.optional(),
    qty: UnitsSchema,
    reason: text().trim().max(500).optional(),
  })
  .refine((t) => t.fromWarehouse !== t.toWarehouse || (t.fromBin ?? '') !== (t.toBin ?? ''), { path: ['toBin'], message: 'Choose a different warehouse or bin to move the stock to.' });
export type TransferInput = z.infer<typeof TransferSchema>;

/** A serial as printed by the maker and captured by scan: letters, digits, dash, dot, slash (a GS1 (21)-safe subset). */
export const SerialSchema = text().trim().regex(/^[A-Za-z0-9][A-Za-z0-9./-]{0,19}$/, 'A serial is 1–20 letters, digits, dots, dashes or slashes.');

export const ReceiptSchema = z.strictObject({
  warehouse,
  reference: text().trim().min(1).max(64).optional(),
  /** The purchase order these goods arrive against (its number); its lines count them as received. */
  purchaseOrder: text().trim().min(1).max(64).optional(),
  lines: z
    .array(
      z
        .strictObject({ sku, bin: bin.optional(), qty: UnitsSchema, serials: z.array(SerialSchema).max(1000).optional() })
        .refine((l) => !l.serials || l.serials.length === l.qty, { path: ['serials'], message: 'Give one serial per unit received.' }),
    )
    .min(1, 'A receipt has at least one line.')
    .max(500),
});
export type ReceiptInput = z.infer<typeof ReceiptSchema>;

export const ReturnSchema = z.strictObject({
  sku,
  warehouse,
  bin: bin.optional(),
  qty: UnitsSchema,
  jobId: z.uuid().optional(),
  reason: text({ error: 'Say why the stock came back.' }).trim().min(3, 'Say why the stock came back.').max(500),
});
export type ReturnInput = z.infer<typeof ReturnSchema>;

export const FilledJobSchema = z.object({ id: text(), reference: text(), company: text(), status: text(), units: z.number() });
export const LedgerResultSchema = z.object({ reference: text(), movements: z.number(), filledJobs: z.array(FilledJobSchema) });
export type LedgerResult = z.infer<typeof LedgerResultSchema>;

export const LowStockSchema = z.object({
  sku: text(),
  name: text(),
  onHand: z.number(),
  available: z.number(),
  backordered: z.number(),
  min: z.number(),
  max: z.number(),
  /** Units to bring it back up to its maximum (before supplier pack sizes). */
  toMax: z.number(),
});
export type LowStock = z.infer<typeof LowStockSchema>;

export const StockLimitSchema = z
  .strictObject({ min: z.number().int().min(0).max(1_000_000), max: z.number().int().min(0).max(1_000_000) })
  .refine((l) => l.max >= l.min, { path: ['max'], message: 'The maximum must be at least the minimum.' });

const code = text().trim().toUpperCase().regex(/^[A-Z0-9-]{1,16}$/, 'Use 1–16 letters, digits or dashes.');
export const WarehouseInputSchema = z.strictObject({ code, name: text().trim().min(1).max(80), rank: z.number().int().min(1).max(99) });
export type WarehouseInput = z.infer<typeof WarehouseInputSchema>;
export const BinInputSchema = z.strictObject({ code, pickOrder: z.number().int().min(0).max(1_000_000) });
export type BinInput = z.infer<typeof BinInputSchema>;
export const DefaultBinSchema = z.strictObject({ sku, warehouse, bin });
export type DefaultBinInput = z.infer<typeof DefaultBinSchema>;
export type StockLimitInput = z.infer<typeof StockLimitSchema>;

/** A part's stock settings: its minimum and maximum (all warehouses), its default bin per warehouse. */
export const PartStockSettingsSchema = z.object({
  sku: text(),
  limits: z.object({ min: z.number(), max: z.number() }).nullable(),
  defaultBins: z.array(z.object({ warehouse: text(), bin: text() })),
});
export type PartStockSettings = z.infer<typeof PartStockSettingsSchema>;

export const WarehouseSchema = z.object({
  id: text(),
  code: text(),
  name: text(),
  rank: z.number(),
  bins: z.array(z.object({ id: text(), code: text(), pickOrder: z.number(), parts: z.number() })),
});
export type Warehouse = z.infer<typeof WarehouseSchema>;
