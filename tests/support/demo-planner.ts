// The demo catalogue's ranges as the planner sees them, built from seed/data the way the
// planner service builds them from the database (mass per sold pack, lengths, list prices).
import { parts, ranges } from '../../seed/data/catalogue.ts';
import { BomRulesSchema } from '../../shared/domain/bom-rules.ts';
import type { PlannerInverter, PlannerPart, PlannerRange, PlannerUnit } from '../../shared/domain/planner.ts';

const bySku = new Map(parts.map((p) => [p.sku, p]));

export function demoPart(sku: string) {
  const p = bySku.get(sku);
  if (!p) throw new Error(`No demo part ${sku}`);
  return p;
}

function attrs(sku: string): Record<string, unknown> {
  return demoPart(sku).attributes as unknown as Record<string, unknown>;
}

function num(a: Record<string, unknown>, key: string): number | null {
  return typeof a[key] === 'number' ? (a[key] as number) : null;
}

function unit(sku: string): PlannerUnit {
  const p = demoPart(sku);
  const a = attrs(sku);
  return {
    sku,
    name: p.name,
    nominalV: num(a, 'nominalV') ?? 0,
    ratedAh: num(a, 'ratedAh') ?? 0,
    usableKwh: num(a, 'usableKwh'),
    cellsInSeries: num(a, 'cellsInSeries'),
    minOperatingV: num(a, 'minOperatingV'),
    maxChargeV: num(a, 'maxChargeV'),
    heightMm: p.heightMm ?? 0,
    widthMm: p.widthMm ?? 0,
    depthMm: p.depthMm ?? 0,
    massKg: p.massKg,
    cycleLife: num(a, 'cycleLife'),
    eolSohPct: num(a, 'eolSohPct'),
    warrantedMwh: num(a, 'warrantedMwh'),
    roundTripEfficiencyPct: num(a, 'roundTripEfficiencyPct'),
    carriesCells: p.category === 'module' || a.carriesCells === true,
    ipRating: p.ipRating ?? null,
  };
}

export const demoParts: Record<string, PlannerPart> = Object.fromEntries(
  parts.map((p) => {
    const length = num(p.attributes as unknown as Record<string, unknown>, 'lengthM');
    return [p.sku, { sku: p.sku, name: p.name, category: p.category, packSize: p.packSize, massKg: p.massKg, lengthM: length ?? (p.unit === 'm' ? 1 : null), listPriceCents: p.listPriceCents }];
  }),
);

export function demoRange(code: string): PlannerRange {
  const r = ranges.find((x) => x.code === code);
  if (!r) throw new Error(`No demo range ${code}`);
  return {
    id: r.code,
    name: r.name,
    connection: r.connection,
    minModules: r.minModules,
    maxModules: r.maxModules,
    maxStacks: r.maxStacks,
    baseHeightMm: r.baseHeightMm,
    defaultDodPct: r.defaultDodPct,
    controller: unit(r.controllerSku),
    module: unit(r.moduleSku),
    rules: BomRulesSchema.parse(r.rules),
    inverterSkus: r.compatibleInverterSkus,
  };
}

export function demoInverter(sku: string): PlannerInverter {
  const p = demoPart(sku);
  const a = attrs(sku);
  return {
    sku,
    name: p.name,
    batteryMinV: num(a, 'batteryMinV') ?? 0,
    batteryMaxV: num(a, 'batteryMaxV') ?? 0,
    batteryInputs: num(a, 'batteryInputs') ?? 1,
    parallelStacks: num(a, 'parallelStacks'),
    maxBatteryKwh: num(a, 'maxBatteryKwh'),
    lifecycle: p.lifecycle,
    supersededBy: p.supersededBy ?? null,
    listPriceCents: p.listPriceCents,
  };
}

export const demoRangeCodes = ranges.map((r) => r.code);
