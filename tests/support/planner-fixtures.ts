// Invented battery ranges, parts and inverters for planner tests. Every figure is made up
// for the tests except where a test says otherwise; "Tidewell" is not a real maker.
import { BomRulesSchema, type BomRuleInput } from '../../shared/domain/bom-rules.ts';
import type { PlannerInverter, PlannerPart, PlannerRange, PlannerUnit } from '../../shared/domain/planner.ts';

export function makeUnit(overrides: Partial<PlannerUnit> = {}): PlannerUnit {
  return {
    sku: 'TW-MOD-51',
    name: 'Tidewell 51 V module',
    nominalV: 51.2,
    ratedAh: 100,
    usableKwh: null,
    cellsInSeries: 16,
    minOperatingV: null,
    maxChargeV: null,
    heightMm: 240,
    widthMm: 650,
    depthMm: 400,
    massKg: 48,
    cycleLife: 6000,
    eolSohPct: 70,
    warrantedMwh: null,
    roundTripEfficiencyPct: 95,
    carriesCells: true,
    ...overrides,
  };
}

export function makeController(overrides: Partial<PlannerUnit> = {}): PlannerUnit {
  return makeUnit({
    sku: 'TW-CTL',
    name: 'Tidewell stack controller',
    nominalV: 0,
    ratedAh: 0,
    cellsInSeries: 0,
    heightMm: 250,
    widthMm: 650,
    depthMm: 450,
    massKg: 18,
    cycleLife: null,
    eolSohPct: null,
    roundTripEfficiencyPct: null,
    carriesCells: false,
    ...overrides,
  });
}

export const PART_SKUS = {
  feet: 'TW-FEET',
  endCap: 'TW-ENDCAP',
  terminator: 'TW-TERM',
  bracket: 'TW-BRKT',
  cableSet: 'TW-CABLE',
  cover: 'TW-COVER',
  earth: 'TW-EARTH',
  combiner: 'TW-COMB',
  tieStrap: 'TW-TIE',
} as const;

export function tidewellParts(overrides: Record<string, Partial<PlannerPart>> = {}): Record<string, PlannerPart> {
  const parts: PlannerPart[] = [
    // Mass is per sold pack, as in the catalogue: a pack of 4 feet at 0.5 kg each weighs 2 kg.
    { sku: PART_SKUS.feet, name: 'Adjustable feet, pack of 4', category: 'feet', packSize: 4, massKg: 2 },
    { sku: PART_SKUS.endCap, name: 'Stack end cap', category: 'end-cap', packSize: 1, massKg: 0.2 },
    { sku: PART_SKUS.terminator, name: 'Comms terminator', category: 'comms-terminator', packSize: 1, massKg: 0.05 },
    { sku: PART_SKUS.bracket, name: 'Wall bracket', category: 'wall-bracket', packSize: 1, massKg: 1 },
    { sku: PART_SKUS.cableSet, name: 'Stack cable set', category: 'cable-set', packSize: 1, massKg: 2 },
    { sku: PART_SKUS.cover, name: 'Cable protection cover', category: 'cable-cover', packSize: 1, massKg: 1.5 },
    { sku: PART_SKUS.earth, name: 'Earth bonding lead', category: 'earth-lead', packSize: 1, massKg: 0.3 },
    { sku: PART_SKUS.combiner, name: 'Parallel combiner box', category: 'accessory', packSize: 1, massKg: 4 },
    { sku: PART_SKUS.tieStrap, name: 'Top tie strap', category: 'accessory', packSize: 1, massKg: 0.4 },
  ];
  return Object.fromEntries(parts.map((p) => [p.sku, { ...p, ...overrides[p.sku] }]));
}

/** The typical rules of domain.md §3, as data. */
export const TYPICAL_RULES: BomRuleInput[] = [
  { sku: PART_SKUS.feet, basis: 'per-stack', qty: 4 },
  { sku: PART_SKUS.endCap, basis: 'per-stack', qty: 1 },
  { sku: PART_SKUS.terminator, basis: 'per-system', qty: 1 },
  { sku: PART_SKUS.bracket, basis: 'per-n-modules', qty: 1, divisor: 3 },
  { sku: PART_SKUS.cableSet, basis: 'per-stack', qty: 1 },
  { sku: PART_SKUS.cover, basis: 'per-stack', qty: 1, when: { kind: 'dvc-b-or-c' } },
  { sku: PART_SKUS.earth, basis: 'per-stack', qty: 1 },
  { sku: PART_SKUS.combiner, basis: 'per-system', qty: 1, when: { kind: 'multi-stack' } },
  { sku: PART_SKUS.tieStrap, basis: 'per-stack', qty: 1, when: { kind: 'height-over', mm: 1500 } },
];

export function makeRange(overrides: Partial<PlannerRange> & { ruleInputs?: BomRuleInput[] } = {}): PlannerRange {
  const { ruleInputs, ...rest } = overrides;
  return {
    id: 'tidewell-terrace',
    name: 'Tidewell Terrace',
    connection: 'series',
    minModules: 2,
    maxModules: 8,
    maxStacks: 3,
    baseHeightMm: 100,
    defaultDodPct: null,
    controller: makeController(),
    module: makeUnit(),
    rules: BomRulesSchema.parse(ruleInputs ?? TYPICAL_RULES),
    ...rest,
  };
}

/** High-voltage series range: modules add voltage. */
export function seriesRange(overrides: Partial<PlannerRange> & { ruleInputs?: BomRuleInput[] } = {}): PlannerRange {
  return makeRange(overrides);
}

/** 48 V-class parallel range: modules add capacity at one voltage. */
export function parallelRange(overrides: Partial<PlannerRange> & { ruleInputs?: BomRuleInput[] } = {}): PlannerRange {
  return makeRange({
    id: 'tidewell-harbour',
    name: 'Tidewell Harbour',
    connection: 'parallel',
    minModules: 1,
    maxModules: 6,
    maxStacks: 2,
    ...overrides,
  });
}

export function makeInverter(overrides: Partial<PlannerInverter> = {}): PlannerInverter {
  return {
    sku: 'KL-HY-10',
    name: 'Kestrel Lane 10 kW hybrid',
    batteryMinV: 80,
    batteryMaxV: 600,
    batteryInputs: 1,
    maxBatteryKwh: null,
    ...overrides,
  };
}

/** Low-voltage inverter for 48 V-class batteries. */
export function lowVoltageInverter(overrides: Partial<PlannerInverter> = {}): PlannerInverter {
  return makeInverter({
    sku: 'KL-LV-5',
    name: 'Kestrel Lane 5 kW low-voltage',
    batteryMinV: 40,
    batteryMaxV: 60,
    batteryInputs: 2,
    ...overrides,
  });
}
