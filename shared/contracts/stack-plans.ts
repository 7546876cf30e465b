import { z } from 'zod';
import { BomRulesSchema } from '../domain/bom-rules.ts';
import { CategoryCodeSchema } from './part-attributes.ts';
import { RangeSummarySchema } from './parts.ts';

export const StackPlanRequestSchema = z
  .strictObject({
    rangeId: z.string().trim().min(1, 'Choose a range.').max(64),
    modules: z.number().int('Modules are whole units.').min(1, 'A stack has at least 1 module.').max(64, 'At most 64 modules per stack.').optional(),
    targetUsableKwh: z.number().positive('The target usable energy must be above 0 kWh.').max(2000, 'Targets above 2,000 kWh are not home systems.').optional(),
    inverterSku: z.string().trim().min(1).max(64).nullable().optional(),
    stacks: z.number().int().min(1, 'At least 1 stack.').max(16, 'At most 16 stacks.').optional(),
  })
  .refine((r) => r.modules !== undefined || r.targetUsableKwh !== undefined, {
    path: ['modules'],
    message: 'Give a module count per stack or a target usable energy.',
  });
export type StackPlanRequest = z.infer<typeof StackPlanRequestSchema>;

export const CautionSchema = z.object({ code: z.string(), text: z.string(), source: z.string() });

export const PlanBomLineSchema = z.object({
  sku: z.string(),
  name: z.string(),
  category: z.string(),
  qtyNeeded: z.number(),
  qtyUnits: z.number(),
  packSize: z.number(),
  packs: z.number(),
  reason: z.string(),
  rules: z.array(z.string()),
  available: z.number(),
  availability: z.array(z.object({ warehouse: z.string(), warehouseName: z.string(), available: z.number() })),
  short: z.number(),
});
export type PlanBomLine = z.infer<typeof PlanBomLineSchema>;

export const StackPlanSchema = z.object({
  rangeId: z.string(),
  rangeName: z.string(),
  inverterSku: z.string().nullable(),
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
  inverterFit: z.object({ fits: z.boolean(), reason: z.string().optional(), code: z.string().optional() }).nullable(),
  heightMm: z.number(),
  massKg: z.number(),
  footprintM2: z.number(),
  floorLoadKpa: z.number(),
  throughputMwh: z.number().nullable(),
  throughputAssumptions: z.array(z.string()),
  equivalentCycles: z.number().nullable(),
  yearsAtOneCyclePerDay: z.number().nullable(),
  roundTripEfficiencyPct: z.number().nullable(),
  chargeEfficiencyPct: z.number().nullable(),
  dischargeEfficiencyPct: z.number().nullable(),
  assumptions: z.array(z.string()),
  cautions: z.array(CautionSchema),
  bom: z.array(PlanBomLineSchema),
  units: z.array(z.object({ kind: z.enum(['controller', 'module', 'feet']), sku: z.string().nullable(), name: z.string(), heightMm: z.number(), carriesCells: z.boolean() })),
  /** The widest unit, for drawing the stack to scale. */
  unitWidthMm: z.number(),
});
export type StackPlanResult = z.infer<typeof StackPlanSchema>;

export const SavePlanSchema = z.strictObject({
  name: z.string().trim().min(1, 'Name the plan (a site or customer reference).').max(120),
  siteSuburb: z.string().trim().max(80).optional(),
  sitePostcode: z.string().trim().regex(/^\d{4}$/, 'An Australian postcode has 4 digits.').optional(),
  /** Staff plan for a customer account; installers always plan for their own company. */
  companyId: z.string().uuid().optional(),
  request: StackPlanRequestSchema,
});
export type SavePlanInput = z.infer<typeof SavePlanSchema>;

export const SavedPlanSchema = z.object({
  id: z.string(),
  name: z.string(),
  status: z.enum(['draft']),
  companyId: z.string(),
  companyName: z.string(),
  siteSuburb: z.string().nullable(),
  sitePostcode: z.string().nullable(),
  request: z.record(z.string(), z.unknown()),
  rangeName: z.string(),
  usableKwh: z.number(),
  modulesPerStack: z.number(),
  stacks: z.number(),
  createdBy: z.string(),
  createdAt: z.string(),
});
export type SavedPlan = z.infer<typeof SavedPlanSchema>;

/** What the range editor sends. Rules are data, validated by the shared schema. */
export const RangeInputSchema = z
  .strictObject({
    name: z.string().trim().min(2).max(120),
    connection: z.enum(['series', 'parallel']),
    controllerSku: z.string().trim().min(1).max(64),
    moduleSku: z.string().trim().min(1).max(64),
    minModules: z.number().int().min(1).max(64),
    maxModules: z.number().int().min(1).max(64),
    maxStacks: z.number().int().min(1).max(16),
    baseHeightMm: z.number().int().min(0).max(1000),
    defaultDodPct: z.number().min(10).max(100).nullable(),
    inverterSkus: z.array(z.string().trim().min(1).max(64)).max(50),
    rules: BomRulesSchema,
  })
  .refine((r) => r.maxModules >= r.minModules, { path: ['maxModules'], message: 'The maximum must be at least the minimum.' });
export type RangeInput = z.input<typeof RangeInputSchema>;

export const InverterOptionSchema = z.object({
  sku: z.string(),
  name: z.string(),
  makerName: z.string(),
  batteryMinV: z.number(),
  batteryMaxV: z.number(),
  batteryInputs: z.number(),
  parallelStacks: z.number().nullable(),
  maxBatteryKwh: z.number().nullable(),
  lifecycle: z.string(),
});

/** Everything the client needs to run the shared planner itself (the range editor's live preview). */
export const RangeDetailSchema = RangeSummarySchema.extend({
  baseHeightMm: z.number(),
  defaultDodPct: z.number().nullable(),
  inverterSkus: z.array(z.string()),
  rules: BomRulesSchema,
  planner: z.object({
    range: z.record(z.string(), z.unknown()),
    parts: z.record(z.string(), z.object({ sku: z.string(), name: z.string(), category: CategoryCodeSchema.or(z.string()), packSize: z.number(), massKg: z.number().nullable().optional() })),
    inverters: z.array(InverterOptionSchema.omit({ makerName: true, lifecycle: true })),
  }),
  abilities: z.object({ edit: z.boolean() }),
});
export type RangeDetail = z.infer<typeof RangeDetailSchema>;
