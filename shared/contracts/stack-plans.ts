import { z } from 'zod';
import { text } from './text.ts';
import { BomRulesSchema } from '../domain/bom-rules.ts';
import { COUNTRIES, FLOORS, LOCATIONS, SiteInputSchema, WALLS } from '../domain/site.ts';
import { CategoryCodeSchema } from './part-attributes.ts';
import { RangeSummarySchema } from './parts.ts';

export const StackPlanRequestSchema = z
  .strictObject({
    rangeId: text().trim().min(1, 'Choose a range.').max(64),
    modules: z.number().int('Modules are whole units.').min(1, 'A stack has at least 1 module.').max(64, 'At most 64 modules per stack.').optional(),
    targetUsableKwh: z.number().positive('The target usable energy must be above 0 kWh.').max(2000, 'Targets above 2,000 kWh are not home systems.').optional(),
    inverterSku: text().trim().min(1).max(64).nullable().optional(),
    stacks: z.number().int().min(1, 'At least 1 stack.').max(16, 'At most 16 stacks.').optional(),
    /** The site; anything left out is assumed, and the answer says what. */
    site: SiteInputSchema.optional(),
    /** Put the chosen inverter on the BOM as a line of its own. */
    includeInverter: z.boolean().optional(),
  })
  .refine((r) => r.modules !== undefined || r.targetUsableKwh !== undefined, {
    path: ['modules'],
    message: 'Give a module count per stack or a target usable energy.',
  })
  .refine((r) => r.modules === undefined || r.targetUsableKwh === undefined, {
    path: ['targetUsableKwh'],
    message: 'Give a module count per stack or a target usable energy, not both: one of them would be ignored.',
  })
  .refine((r) => !r.includeInverter || !!r.inverterSku, {
    path: ['includeInverter'],
    message: 'Choose an inverter to include it on the bill of materials.',
  });
export type StackPlanRequest = z.infer<typeof StackPlanRequestSchema>;

export const CautionSchema = z.object({ code: text(), text: text(), source: text() });

export const PlanBomLineSchema = z.object({
  sku: text(),
  name: text(),
  category: text(),
  qtyNeeded: z.number(),
  qtyUnits: z.number(),
  packSize: z.number(),
  packs: z.number(),
  reason: text(),
  rules: z.array(text()),
  /** The range's rules (numbered from 1) behind the line; empty for the stack's units and the inverter. */
  ruleNumbers: z.array(z.number()),
  /** Metres the line provides (cables, covers, conduit). */
  lengthM: z.number().optional(),
  /** Ex GST list price of one sold pack, in cents. Installers see prices, never cost. */
  unitPriceCents: z.number().nullable(),
  lineTotalCents: z.number().nullable(),
  available: z.number(),
  availability: z.array(z.object({ warehouse: text(), warehouseName: text(), available: z.number() })),
  short: z.number(),
});
export type PlanBomLine = z.infer<typeof PlanBomLineSchema>;

export const StackPlanSchema = z.object({
  rangeId: text(),
  rangeName: text(),
  inverterSku: text().nullable(),
  stacks: z.number(),
  modulesPerStack: z.number(),
  cellUnitsPerStack: z.number(),
  connection: z.enum(['series', 'parallel']),
  nominalKwh: z.number(),
  usableKwh: z.number(),
  nominalVoltage: z.number(),
  maxVoltage: z.number(),
  minVoltage: z.number(),
  capacityAh: z.number(),
  dvc: z.enum(['A', 'B', 'C']),
  inverterFit: z.object({ fits: z.boolean(), reason: text().optional(), code: text().optional(), warnings: z.array(text()).optional() }).nullable(),
  heightMm: z.number(),
  massKg: z.number(),
  footprintM2: z.number(),
  floorLoadKpa: z.number(),
  footLoadKn: z.number(),
  throughputMwh: z.number().nullable(),
  throughputAssumptions: z.array(text()),
  warrantedThroughputMwh: z.number().nullable(),
  warrantedThroughputNote: text().nullable(),
  equivalentCycles: z.number().nullable(),
  yearsAtOneCyclePerDay: z.number().nullable(),
  roundTripEfficiencyPct: z.number().nullable(),
  chargeEfficiencyPct: z.number().nullable(),
  dischargeEfficiencyPct: z.number().nullable(),
  assumptions: z.array(text()),
  cautions: z.array(CautionSchema),
  bom: z.array(PlanBomLineSchema),
  units: z.array(z.object({ kind: z.enum(['controller', 'module', 'feet']), sku: text().nullable(), name: text(), heightMm: z.number(), carriesCells: z.boolean() })),
  /** The widest unit, for drawing the stack to scale. */
  unitWidthMm: z.number(),
  /** The site planned for, defaults filled in. */
  site: z.object({
    cableRunM: z.number(),
    wall: z.enum(WALLS),
    location: z.enum(LOCATIONS),
    sharesHabitableWall: z.boolean(),
    floor: z.enum(FLOORS),
    country: z.enum(COUNTRIES),
  }),
  /** Site facts assumed because the request left them out. */
  siteAssumed: z.array(text()),
  totals: z.object({ gstMethod: z.enum(['per-line', 'per-invoice']), subtotalCents: z.number(), gstCents: z.number(), totalCents: z.number(), unpricedLines: z.number() }),
  /** The asker's tier discount already in the prices (0: list prices). */
  discountPct: z.number(),
});
export type StackPlanResult = z.infer<typeof StackPlanSchema>;

export const SavePlanSchema = z.strictObject({
  name: text().trim().min(1, 'Name the plan (a site or customer reference).').max(120),
  siteSuburb: text().trim().max(80).optional(),
  sitePostcode: text().trim().regex(/^\d{4}$/, 'An Australian postcode has 4 digits.').optional(),
  /** Staff plan for a customer account; installers always plan for their own company. */
  companyId: text().uuid().optional(),
  request: StackPlanRequestSchema,
});
export type SavePlanInput = z.infer<typeof SavePlanSchema>;

export const SavedPlanSchema = z.object({
  id: text(),
  name: text(),
  status: z.enum(['draft']),
  companyId: text(),
  companyName: text(),
  siteSuburb: text().nullable(),
  sitePostcode: text().nullable(),
  request: z.record(text(), z.unknown()),
  rangeName: text(),
  usableKwh: z.number(),
  modulesPerStack: z.number(),
  stacks: z.number(),
  createdBy: text(),
  createdAt: text(),
});
export type SavedPlan = z.infer<typeof SavedPlanSchema>;

/** What the range editor sends. Rules are data, validated by the shared schema. */
export const RangeInputSchema = z
  .strictObject({
    name: text().trim().min(2).max(120),
    connection: z.enum(['series', 'parallel']),
    controllerSku: text().trim().min(1).max(64),
    moduleSku: text().trim().min(1).max(64),
    minModules: z.number().int().min(1).max(64),
    maxModules: z.number().int().min(1).max(64),
    maxStacks: z.number().int().min(1).max(16),
    baseHeightMm: z.number().int().min(0).max(1000),
    defaultDodPct: z.number().min(10).max(100).nullable(),
    inverterSkus: z.array(text().trim().min(1).max(64)).max(50),
    rules: BomRulesSchema,
  })
  .refine((r) => r.maxModules >= r.minModules, { path: ['maxModules'], message: 'The maximum must be at least the minimum.' });
export type RangeInput = z.input<typeof RangeInputSchema>;

export const InverterOptionSchema = z.object({
  sku: text(),
  name: text(),
  makerName: text(),
  batteryMinV: z.number(),
  batteryMaxV: z.number(),
  batteryInputs: z.number(),
  parallelStacks: z.number().nullable(),
  maxBatteryKwh: z.number().nullable(),
  lifecycle: text(),
  supersededBy: text().nullable(),
  listPriceCents: z.number().nullable(),
});

/** Everything the client needs to run the shared planner itself (the range editor's live preview). */
export const RangeDetailSchema = RangeSummarySchema.extend({
  baseHeightMm: z.number(),
  defaultDodPct: z.number().nullable(),
  inverterSkus: z.array(text()),
  rules: BomRulesSchema,
  planner: z.object({
    range: z.record(text(), z.unknown()),
    parts: z.record(
      text(),
      z.object({
        sku: text(),
        name: text(),
        category: CategoryCodeSchema.or(text()),
        packSize: z.number(),
        massKg: z.number().nullable().optional(),
        lengthM: z.number().nullable().optional(),
        listPriceCents: z.number().nullable().optional(),
      }),
    ),
    inverters: z.array(InverterOptionSchema.omit({ makerName: true, lifecycle: true, supersededBy: true, listPriceCents: true })),
  }),
  abilities: z.object({ edit: z.boolean() }),
});
export type RangeDetail = z.infer<typeof RangeDetailSchema>;
