import { z } from 'zod';
import { text } from './text.ts';

/**
 * Typed, per-category part attributes.
 *
 * Every part carries one attributes object whose `category` picks the shape. The schemas
 * bound every number so that absurd input (a 15 kV "home" battery, a 900 % efficiency) is
 * refused, and cross-field checks report the offending field's path so forms can show the
 * message next to it. `ATTRIBUTE_FIELDS` describes the same fields for forms and the part
 * page; a unit test keeps the two in step.
 */

export const CATEGORY_CODES = [
  'module',
  'controller',
  'feet',
  'wall-bracket',
  'end-cap',
  'cable-set',
  'cable-cover',
  'earth-lead',
  'comms-terminator',
  'inverter',
  'accessory',
] as const;
export type CategoryCode = (typeof CATEGORY_CODES)[number];
export const CategoryCodeSchema = z.enum(CATEGORY_CODES);

export const CATEGORY_LABELS: Record<CategoryCode, string> = {
  module: 'Battery module',
  controller: 'Controller',
  feet: 'Feet',
  'wall-bracket': 'Wall bracket',
  'end-cap': 'End cap',
  'cable-set': 'Cable set',
  'cable-cover': 'Cable-protection cover',
  'earth-lead': 'Earth bonding lead',
  'comms-terminator': 'Comms terminator',
  inverter: 'Inverter',
  accessory: 'Accessory',
};

export const CHEMISTRIES = ['LFP', 'NMC', 'LTO'] as const;
export type Chemistry = (typeof CHEMISTRIES)[number];
export const COMMS_PROTOCOLS = ['CAN', 'RS485', 'Ethernet', 'Wi-Fi'] as const;
export type CommsProtocol = (typeof COMMS_PROTOCOLS)[number];
export const TERMINATOR_PROTOCOLS = ['CAN', 'RS485'] as const;
export const BRACKET_FIXINGS = ['stud', 'masonry', 'universal'] as const;
export type BracketFixing = (typeof BRACKET_FIXINGS)[number];

// ---------------------------------------------------------------------------------------
// Bounded building blocks (messages are shown to people, so they say what is wrong).

const num = (label: string, min: number, max: number, unit = '') => {
  const u = unit ? ` ${unit}` : '';
  return z
    .number({ error: `${label} must be a number.` })
    .min(min, `${label} must be at least ${min}${u}.`)
    .max(max, `${label} must be at most ${max}${u}.`);
};
const positive = (label: string, max: number, unit = '') =>
  z
    .number({ error: `${label} must be a number.` })
    .positive(`${label} must be greater than 0.`)
    .max(max, `${label} must be at most ${max}${unit ? ` ${unit}` : ''}.`);
const int = (label: string, min: number, max: number) =>
  z
    .number({ error: `${label} must be a whole number.` })
    .int(`${label} must be a whole number.`)
    .min(min, `${label} must be at least ${min}.`)
    .max(max, `${label} must be at most ${max}.`);
const words = (label: string, max = 80) =>
  text({ error: `${label} must be text.` })
    .trim()
    .min(1, `${label} cannot be empty.`)
    .max(max, `${label} must be at most ${max} characters.`);
const bool = (label: string) => z.boolean({ error: `${label} must be yes or no.` });

// ---------------------------------------------------------------------------------------
// Cell-carrying units (modules, and controllers that carry cells).

const cellShape = {
  nominalV: num('Nominal voltage', 1, 1500, 'V'),
  ratedAh: num('Rated capacity', 1, 2000, 'Ah'),
  usableKwh: num('Usable energy', 0.1, 200, 'kWh').optional(),
  chemistry: z.enum(CHEMISTRIES, { error: 'Chemistry must be LFP, NMC or LTO.' }),
  cellsInSeries: int('Cells in series', 1, 500).optional(),
  minOperatingV: num('Minimum operating voltage', 1, 1500, 'V').optional(),
  maxChargeV: num('Maximum charge voltage', 1, 1500, 'V').optional(),
  maxChargeA: positive('Maximum charge current', 2000, 'A').optional(),
  maxDischargeA: positive('Maximum discharge current', 2000, 'A').optional(),
  cycleLife: int('Rated cycle life', 1, 100_000).optional(),
  eolSohPct: num('End-of-life state of health', 50, 100, '%').optional(),
  warrantedMwh: positive('Warranted throughput', 10_000, 'MWh').optional(),
  roundTripEfficiencyPct: num('Round-trip efficiency', 50, 100, '%').optional(),
};

/** Per-cell nominal voltage that any lithium chemistry we stock could plausibly have. */
const CELL_V_MIN = 1.5;
const CELL_V_MAX = 4.2;

type CellValues = {
  chemistry?: string;
  nominalV?: number;
  ratedAh?: number;
  usableKwh?: number;
  cellsInSeries?: number;
  minOperatingV?: number;
  maxChargeV?: number;
};

function checkCellValues(v: CellValues, ctx: z.RefinementCtx): void {
  // The planner can only infer voltages from the cell count for LFP; other chemistries must state them.
  if (v.chemistry !== undefined && v.chemistry !== 'LFP') {
    for (const key of ['minOperatingV', 'maxChargeV'] as const)
      if (v[key] === undefined)
        ctx.addIssue({ code: 'custom', path: [key], message: `Give the ${key === 'maxChargeV' ? 'maximum charge' : 'minimum operating'} voltage: it cannot be inferred for ${v.chemistry} cells.` });
  }
  if (v.minOperatingV !== undefined && v.maxChargeV !== undefined && v.minOperatingV >= v.maxChargeV) {
    ctx.addIssue({
      code: 'custom',
      path: ['maxChargeV'],
      message: 'Maximum charge voltage must be above the minimum operating voltage.',
    });
  }
  if (v.nominalV !== undefined) {
    if (v.minOperatingV !== undefined && v.minOperatingV > v.nominalV) {
      ctx.addIssue({
        code: 'custom',
        path: ['minOperatingV'],
        message: 'Minimum operating voltage cannot be above the nominal voltage.',
      });
    }
    if (v.maxChargeV !== undefined && v.maxChargeV < v.nominalV) {
      ctx.addIssue({
        code: 'custom',
        path: ['maxChargeV'],
        message: 'Maximum charge voltage cannot be below the nominal voltage.',
      });
    }
    if (v.cellsInSeries !== undefined) {
      const perCell = v.nominalV / v.cellsInSeries;
      if (perCell < CELL_V_MIN || perCell > CELL_V_MAX) {
        ctx.addIssue({
          code: 'custom',
          path: ['cellsInSeries'],
          message: `${v.cellsInSeries} cells for ${v.nominalV} V is ${perCell.toFixed(2)} V a cell; no lithium cell sits outside ${CELL_V_MIN}–${CELL_V_MAX} V.`,
        });
      }
    }
  }
  if (v.usableKwh !== undefined && v.nominalV !== undefined && v.ratedAh !== undefined) {
    // Nominal energy = V × Ah; usable energy can never exceed it.
    const nominalKwh = (v.nominalV * v.ratedAh) / 1000;
    if (v.usableKwh > nominalKwh * 1.0 + 1e-9) {
      ctx.addIssue({
        code: 'custom',
        path: ['usableKwh'],
        message: `Usable energy cannot exceed the nominal energy (${nominalKwh.toFixed(2)} kWh = V × Ah).`,
      });
    }
  }
}

export const ModuleAttributesSchema = z
  .strictObject({ category: z.literal('module'), ...cellShape })
  .superRefine(checkCellValues);

export const ControllerAttributesSchema = z
  .strictObject({
    category: z.literal('controller'),
    carriesCells: bool('Carries cells'),
    ...cellShape,
    nominalV: cellShape.nominalV.optional(),
    ratedAh: cellShape.ratedAh.optional(),
    chemistry: cellShape.chemistry.optional(),
    hasDcBreaker: bool('DC breaker/isolator').optional(),
    hasDisplay: bool('Display').optional(),
    comms: z
      .array(z.enum(COMMS_PROTOCOLS, { error: 'Comms must be CAN, RS485, Ethernet or Wi-Fi.' }))
      .max(COMMS_PROTOCOLS.length)
      .refine((l) => new Set(l).size === l.length, 'List each comms protocol once.')
      .optional(),
    maxStackModules: int('Maximum modules in a stack', 1, 32).optional(),
  })
  .superRefine((v, ctx) => {
    if (v.carriesCells) {
      if (v.nominalV === undefined) {
        ctx.addIssue({ code: 'custom', path: ['nominalV'], message: 'A controller that carries cells needs its nominal voltage.' });
      }
      if (v.ratedAh === undefined) {
        ctx.addIssue({ code: 'custom', path: ['ratedAh'], message: 'A controller that carries cells needs its rated capacity.' });
      }
    } else {
      for (const key of ['ratedAh', 'usableKwh', 'cellsInSeries'] as const) {
        if (v[key] !== undefined) {
          ctx.addIssue({ code: 'custom', path: [key], message: 'A controller without cells has no capacity or cells of its own.' });
        }
      }
    }
    checkCellValues(v, ctx);
  });

export const InverterAttributesSchema = z
  .strictObject({
    category: z.literal('inverter'),
    batteryMinV: num('Battery window minimum', 1, 1500, 'V'),
    batteryMaxV: num('Battery window maximum', 1, 1500, 'V'),
    maxChargeA: positive('Maximum charge current', 2000, 'A').optional(),
    maxDischargeA: positive('Maximum discharge current', 2000, 'A').optional(),
    batteryInputs: int('Battery inputs', 1, 8),
    /** Stacks it accepts in parallel, where the maker allows more than one per input (through a combiner). */
    parallelStacks: int('Parallel stacks supported', 1, 16).optional(),
    maxBatteryKwh: num('Maximum battery energy', 0.1, 2000, 'kWh').optional(),
    ratedPowerKw: positive('Rated power', 500, 'kW').optional(),
    phases: z.union([z.literal(1), z.literal(3)], { error: 'Phases must be 1 or 3.' }).optional(),
  })
  .superRefine((v, ctx) => {
    if (v.batteryMinV >= v.batteryMaxV) {
      ctx.addIssue({
        code: 'custom',
        path: ['batteryMaxV'],
        message: 'Battery window maximum must be above its minimum.',
      });
    }
  });

export const FeetAttributesSchema = z.strictObject({
  category: z.literal('feet'),
  unitsPerSet: int('Feet in a set', 1, 16),
  adjustmentMm: num('Height adjustment', 0, 200, 'mm').optional(),
  loadRatingKg: positive('Load rating', 5000, 'kg').optional(),
  heightMm: positive('Base height', 500, 'mm'),
});

export const WallBracketAttributesSchema = z.strictObject({
  category: z.literal('wall-bracket'),
  fixing: z.enum(BRACKET_FIXINGS, { error: 'Fixing must be stud, masonry or universal.' }),
  unitsSupported: int('Units supported', 1, 32).optional(),
});

export const EndCapAttributesSchema = z.strictObject({
  category: z.literal('end-cap'),
  connectorType: words('Connector type').optional(),
});

export const CableSetAttributesSchema = z.strictObject({
  category: z.literal('cable-set'),
  lengthM: positive('Length', 100, 'm'),
  crossSectionMm2: positive('Cross-section', 400, 'mm²'),
  connector: words('Connector').optional(),
});

export const CableCoverAttributesSchema = z.strictObject({
  category: z.literal('cable-cover'),
  lengthM: positive('Length', 100, 'm').optional(),
  material: words('Material').optional(),
});

export const EarthLeadAttributesSchema = z.strictObject({
  category: z.literal('earth-lead'),
  lengthM: positive('Length', 100, 'm').optional(),
  crossSectionMm2: positive('Cross-section', 120, 'mm²').optional(),
});

export const CommsTerminatorAttributesSchema = z.strictObject({
  category: z.literal('comms-terminator'),
  protocol: z.enum(TERMINATOR_PROTOCOLS, { error: 'Protocol must be CAN or RS485.' }),
});

export const AccessoryAttributesSchema = z.strictObject({
  category: z.literal('accessory'),
  purpose: words('Purpose', 200).optional(),
});

export const PartAttributesSchema = z.discriminatedUnion('category', [
  ModuleAttributesSchema,
  ControllerAttributesSchema,
  FeetAttributesSchema,
  WallBracketAttributesSchema,
  EndCapAttributesSchema,
  CableSetAttributesSchema,
  CableCoverAttributesSchema,
  EarthLeadAttributesSchema,
  CommsTerminatorAttributesSchema,
  InverterAttributesSchema,
  AccessoryAttributesSchema,
]);
export type PartAttributes = z.infer<typeof PartAttributesSchema>;
export type PartAttributesInput = z.input<typeof PartAttributesSchema>;
/** The attributes shape of one category, e.g. `AttributesOf<'module'>`. */
export type AttributesOf<C extends CategoryCode> = Extract<PartAttributes, { category: C }>;

// ---------------------------------------------------------------------------------------
// Compliance (per part, optional).

export const IP_RATING_RE = /^IP[0-6X][0-9X]$/;

export const ComplianceSchema = z.strictObject({
  standardsTestedTo: z
    .array(words('Standard', 60))
    .max(30, 'List at most 30 standards.')
    .refine((l) => new Set(l).size === l.length, 'List each standard once.'),
  certificationListing: words('Certification listing', 120).optional(),
  certificationDate: z.iso.date('Certification date must be a date (YYYY-MM-DD).').optional(),
  enclosureIp: text().regex(IP_RATING_RE, 'Enclosure rating looks like IP55 (two digits or X).').optional(),
  touchSafeConnectors: bool('Touch-safe connectors').optional(),
});
export type Compliance = z.infer<typeof ComplianceSchema>;

// ---------------------------------------------------------------------------------------
// Field table for forms and the part page.

export type AttributeFieldKind = 'number' | 'integer' | 'text' | 'boolean' | 'enum' | 'list';
export interface AttributeField {
  key: string;
  label: string;
  unit?: string;
  /**
   * How to render and coerce the value. `enum` values are strings from `options`;
   * `list` is an array of strings from `options`; an `integer` with `options` is a
   * choice among those whole numbers (e.g. inverter phases 1 or 3).
   */
  kind: AttributeFieldKind;
  options?: string[];
  required?: boolean;
}

const cellFields = (required: boolean): AttributeField[] => [
  { key: 'nominalV', label: 'Nominal voltage', unit: 'V', kind: 'number', required },
  { key: 'ratedAh', label: 'Rated capacity', unit: 'Ah', kind: 'number', required },
  { key: 'usableKwh', label: 'Usable energy', unit: 'kWh', kind: 'number' },
  { key: 'chemistry', label: 'Chemistry', kind: 'enum', options: [...CHEMISTRIES], required },
  { key: 'cellsInSeries', label: 'Cells in series', kind: 'integer' },
  { key: 'minOperatingV', label: 'Minimum operating voltage', unit: 'V', kind: 'number' },
  { key: 'maxChargeV', label: 'Maximum charge voltage', unit: 'V', kind: 'number' },
  { key: 'maxChargeA', label: 'Maximum continuous charge current', unit: 'A', kind: 'number' },
  { key: 'maxDischargeA', label: 'Maximum continuous discharge current', unit: 'A', kind: 'number' },
  { key: 'cycleLife', label: 'Rated cycle life', unit: 'cycles', kind: 'integer' },
  { key: 'eolSohPct', label: 'End-of-life state of health', unit: '%', kind: 'number' },
  { key: 'warrantedMwh', label: 'Warranted throughput', unit: 'MWh', kind: 'number' },
  { key: 'roundTripEfficiencyPct', label: 'Round-trip efficiency', unit: '%', kind: 'number' },
];

export const ATTRIBUTE_FIELDS: Record<CategoryCode, AttributeField[]> = {
  module: cellFields(true),
  controller: [
    { key: 'carriesCells', label: 'Carries cells', kind: 'boolean', required: true },
    ...cellFields(false),
    { key: 'hasDcBreaker', label: 'DC breaker/isolator', kind: 'boolean' },
    { key: 'hasDisplay', label: 'State-of-charge display', kind: 'boolean' },
    { key: 'comms', label: 'Comms', kind: 'list', options: [...COMMS_PROTOCOLS] },
    { key: 'maxStackModules', label: 'Maximum modules in a stack', kind: 'integer' },
  ],
  feet: [
    { key: 'unitsPerSet', label: 'Feet in a set', kind: 'integer', required: true },
    { key: 'heightMm', label: 'Base height', unit: 'mm', kind: 'number', required: true },
    { key: 'adjustmentMm', label: 'Height adjustment', unit: 'mm', kind: 'number' },
    { key: 'loadRatingKg', label: 'Load rating', unit: 'kg', kind: 'number' },
  ],
  'wall-bracket': [
    { key: 'fixing', label: 'Fixing', kind: 'enum', options: [...BRACKET_FIXINGS], required: true },
    { key: 'unitsSupported', label: 'Units supported', kind: 'integer' },
  ],
  'end-cap': [{ key: 'connectorType', label: 'Connector type', kind: 'text' }],
  'cable-set': [
    { key: 'lengthM', label: 'Length', unit: 'm', kind: 'number', required: true },
    { key: 'crossSectionMm2', label: 'Cross-section', unit: 'mm²', kind: 'number', required: true },
    { key: 'connector', label: 'Connector', kind: 'text' },
  ],
  'cable-cover': [
    { key: 'lengthM', label: 'Length', unit: 'm', kind: 'number' },
    { key: 'material', label: 'Material', kind: 'text' },
  ],
  'earth-lead': [
    { key: 'lengthM', label: 'Length', unit: 'm', kind: 'number' },
    { key: 'crossSectionMm2', label: 'Cross-section', unit: 'mm²', kind: 'number' },
  ],
  'comms-terminator': [
    { key: 'protocol', label: 'Protocol', kind: 'enum', options: [...TERMINATOR_PROTOCOLS], required: true },
  ],
  inverter: [
    { key: 'batteryMinV', label: 'Battery window minimum', unit: 'V', kind: 'number', required: true },
    { key: 'batteryMaxV', label: 'Battery window maximum', unit: 'V', kind: 'number', required: true },
    { key: 'batteryInputs', label: 'Battery inputs', kind: 'integer', required: true },
    { key: 'parallelStacks', label: 'Parallel stacks supported', kind: 'integer' },
    { key: 'maxChargeA', label: 'Maximum charge current', unit: 'A', kind: 'number' },
    { key: 'maxDischargeA', label: 'Maximum discharge current', unit: 'A', kind: 'number' },
    { key: 'maxBatteryKwh', label: 'Maximum battery energy', unit: 'kWh', kind: 'number' },
    { key: 'ratedPowerKw', label: 'Rated power', unit: 'kW', kind: 'number' },
    { key: 'phases', label: 'Phases', kind: 'integer', options: ['1', '3'] },
  ],
  accessory: [{ key: 'purpose', label: 'Purpose', kind: 'text' }],
};
