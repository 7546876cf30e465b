import { z } from 'zod';
import { text } from './text.ts';
import { isValidGtin } from '../domain/gtin.ts';
import { CategoryCodeSchema, ComplianceSchema, IP_RATING_RE, PartAttributesSchema } from './part-attributes.ts';

export const LIFECYCLES = ['active', 'superseded', 'discontinued'] as const;
export const LifecycleSchema = z.enum(LIFECYCLES);
export type Lifecycle = (typeof LIFECYCLES)[number];
export const LIFECYCLE_LABELS: Record<Lifecycle, string> = { active: 'Active', superseded: 'Superseded', discontinued: 'Discontinued' };

export const UNITS = ['each', 'pack', 'set', 'm'] as const;

export const SKU_RE = /^[A-Z0-9][A-Z0-9._/-]{1,39}$/;
export const SkuSchema = text()
  .trim()
  .transform((s) => s.toUpperCase())
  .pipe(text().regex(SKU_RE, 'A SKU is 2–40 capital letters, digits, dots, dashes or slashes.'));

export const GtinSchema = text()
  .trim()
  .regex(/^(\d{8}|\d{12}|\d{13}|\d{14})$/, 'A GTIN has 8, 12, 13 or 14 digits.')
  .refine(isValidGtin, 'That GTIN’s check digit is wrong: check the number on the label.');

export const DangerousGoodsSchema = z.strictObject({
  unNumber: z.enum(['UN3480', 'UN3481']),
  class: z.literal('9'),
  whRating: z.number().positive('The Wh rating must be above 0.').max(200_000, 'The Wh rating must be at most 200,000 Wh.'),
});

const mm = (label: string) => z.number().int(`${label} is whole millimetres.`).min(1, `${label} must be at least 1 mm.`).max(5000, `${label} must be at most 5,000 mm.`);

/** What purchasing and admin send to create or change a part. */
export const PartInputSchema = z
  .strictObject({
    sku: SkuSchema,
    name: text().trim().min(2, 'Give the part a name.').max(160),
    makerCode: text().trim().min(1, 'Choose a maker.').max(16),
    description: text().trim().max(4000).default(''),
    gtin: GtinSchema.nullable().optional(),
    unit: z.enum(UNITS).default('each'),
    packSize: z.number().int('Pack size is a whole number.').min(1, 'Pack size is at least 1.').max(10_000, 'Pack size must be at most 10,000.'),
    massKg: z.number().min(0, 'Mass cannot be negative.').max(2000, 'Mass must be at most 2,000 kg.'),
    widthMm: mm('Width').nullable().optional(),
    heightMm: mm('Height').nullable().optional(),
    depthMm: mm('Depth').nullable().optional(),
    ipRating: text().regex(IP_RATING_RE, 'An IP rating looks like IP55 or IPX4.').nullable().optional(),
    lifecycle: LifecycleSchema.default('active'),
    supersededBySku: SkuSchema.nullable().optional(),
    dangerousGoods: DangerousGoodsSchema.nullable().optional(),
    costCents: z.number().min(0, 'Cost cannot be negative.').max(100_000_000, 'Cost must be below $1,000,000.').multipleOf(0.01, 'Cost carries at most 4 decimals of a dollar.').nullable().optional(),
    listPriceCents: z.number().int('List price is whole cents.').min(0, 'List price cannot be negative.').max(100_000_000).nullable().optional(),
    attributes: PartAttributesSchema,
    compliance: ComplianceSchema.nullable().optional(),
    supplierSkus: z.array(z.strictObject({ supplier: text().min(1).max(16), sku: text().trim().min(1).max(64) })).max(20).default([]),
  })
  .superRefine((p, ctx) => {
    if (p.lifecycle === 'superseded' && !p.supersededBySku)
      ctx.addIssue({ code: 'custom', path: ['supersededBySku'], message: 'Say which part supersedes this one.' });
    if (p.supersededBySku && p.supersededBySku === p.sku) ctx.addIssue({ code: 'custom', path: ['supersededBySku'], message: 'A part cannot supersede itself.' });
    const carriesCells = p.attributes.category === 'module' || (p.attributes.category === 'controller' && p.attributes.carriesCells);
    if (carriesCells && !p.dangerousGoods)
      ctx.addIssue({ code: 'custom', path: ['dangerousGoods'], message: 'Parts with cells ship as dangerous goods: give the UN number and Wh rating.' });
  });
export type PartInput = z.input<typeof PartInputSchema>;
export type PartInputParsed = z.output<typeof PartInputSchema>;


export const PartListQuerySchema = z.object({
  q: text().trim().max(200).default(''),
  category: CategoryCodeSchema.optional(),
  maker: text().trim().max(16).optional(),
  range: text().trim().max(32).optional(),
  lifecycle: LifecycleSchema.optional(),
  inStock: z.enum(['true', 'false']).optional(),
  sort: z.enum(['relevance', 'sku', 'name', 'category', 'maker']).default('relevance'),
  dir: z.enum(['asc', 'desc']).default('asc'),
  page: z.coerce.number().int().min(1).max(1000).default(1),
  pageSize: z.coerce.number().int().min(1).max(200).default(50),
});
export type PartListQuery = z.infer<typeof PartListQuerySchema>;

export const PartSummarySchema = z.object({
  sku: text(),
  name: text(),
  category: CategoryCodeSchema,
  maker: text(),
  makerName: text(),
  gtin: text().nullable(),
  lifecycle: LifecycleSchema,
  ranges: z.array(text()),
  packSize: z.number(),
  unit: text(),
  listPriceCents: z.number().nullable(),
  available: z.number(),
  inStock: z.boolean(),
  thumbnailUrl: text().nullable(),
});
export type PartSummary = z.infer<typeof PartSummarySchema>;

export const FacetsSchema = z.object({
  category: z.record(text(), z.number()),
  maker: z.record(text(), z.number()),
  range: z.record(text(), z.number()),
  lifecycle: z.record(text(), z.number()),
  inStock: z.record(text(), z.number()),
});
export type Facets = z.infer<typeof FacetsSchema>;

export const PartListResponseSchema = z.object({
  data: z.array(PartSummarySchema),
  facets: FacetsSchema,
  total: z.number(),
  page: z.number(),
  pageSize: z.number(),
  /** Set when q is exactly a SKU, GTIN or supplier SKU (a scan): the client jumps to it. */
  exactSku: text().nullable(),
});
export type PartListResponse = z.infer<typeof PartListResponseSchema>;

export const MediaSchema = z.object({
  id: text(),
  kind: z.enum(['image', 'datasheet']),
  contentType: text(),
  fileName: text(),
  bytes: z.number(),
  url: text(),
  thumbnailUrl: text().nullable(),
});
export type Media = z.infer<typeof MediaSchema>;

export const StockByWarehouseSchema = z.object({
  warehouse: text(),
  warehouseName: text(),
  available: z.number(),
  onHand: z.number().optional(),
  reserved: z.number().optional(),
});

export const PartDetailSchema = PartSummarySchema.extend({
  id: text(),
  description: text(),
  widthMm: z.number().nullable(),
  heightMm: z.number().nullable(),
  depthMm: z.number().nullable(),
  massKg: z.number(),
  ipRating: text().nullable(),
  supersededBy: z.object({ sku: text(), name: text() }).nullable(),
  supersedes: z.array(z.object({ sku: text(), name: text() })),
  dangerousGoods: DangerousGoodsSchema.nullable(),
  attributes: z.record(text(), z.unknown()),
  compliance: z.record(text(), z.unknown()).nullable(),
  supplierSkus: z.array(z.object({ supplier: text(), sku: text() })).optional(),
  /** Only for roles that may see costs. */
  costCents: z.number().nullable().optional(),
  media: z.array(MediaSchema),
  stock: z.array(StockByWarehouseSchema),
  archived: z.boolean(),
  updatedAt: text(),
  abilities: z.object({ edit: z.boolean(), viewCost: z.boolean() }),
});
export type PartDetail = z.infer<typeof PartDetailSchema>;

export const MakerSchema = z.object({ code: text(), name: text(), country: text().nullable(), parts: z.number() });
export type Maker = z.infer<typeof MakerSchema>;

export const RangeSummarySchema = z.object({
  id: text(),
  code: text(),
  name: text(),
  maker: text(),
  makerName: text(),
  connection: z.enum(['series', 'parallel']),
  minModules: z.number(),
  maxModules: z.number(),
  maxStacks: z.number(),
  controllerSku: text(),
  moduleSku: text(),
});
export type RangeSummary = z.infer<typeof RangeSummarySchema>;
