// The stack planner: from a range and a module count (or an energy target) to voltages,
// energy, physical size, a bill of materials with reasons, and the cautions that apply.
// Pure and synchronous so the client can preview as the user types and the server can
// recompute the same plan as the authority.
import Decimal from 'decimal.js';
import {
  applyBomRule,
  mergeAndPack,
  unknownRuleSkus,
  type BomContext,
  type BomDemand,
  type BomLine,
  type BomPart,
  type BomRule,
} from './bom-rules.ts';
import {
  DEFAULT_DOD_PCT,
  DVC_A_MAX_V,
  LFP_CELL_CUTOFF_V,
  LFP_CELL_FULL_V,
  LFP_CELL_NOMINAL_V,
  RESIDENTIAL_FLOOR_KPA,
  dvcClass,
  equivalentFullCycles,
  floorLoadKpa,
  lfpCellsFromNominal,
  lfpMaxChargeVoltage,
  lfpMinVoltage,
  lifetimeThroughput,
  nominalKwh as unitNominalKwh,
  usableKwh as usableKwhOf,
  roundTo,
  splitRoundTripEfficiency,
  yearsAtOneCyclePerDay,
  type Dvc,
} from './energy.ts';

export type Connection = 'series' | 'parallel';

export interface PlannerUnit {
  sku: string;
  name: string;
  nominalV: number;
  ratedAh: number;
  usableKwh?: number | null;
  cellsInSeries?: number | null;
  minOperatingV?: number | null;
  maxChargeV?: number | null;
  heightMm: number;
  widthMm: number;
  depthMm: number;
  massKg: number;
  cycleLife?: number | null;
  eolSohPct?: number | null;
  warrantedMwh?: number | null;
  roundTripEfficiencyPct?: number | null;
  carriesCells: boolean;
}

export interface PlannerRange {
  id: string;
  name: string;
  connection: Connection;
  minModules: number;
  maxModules: number;
  maxStacks: number;
  baseHeightMm: number;
  defaultDodPct?: number | null;
  controller: PlannerUnit;
  module: PlannerUnit;
  rules: BomRule[];
}

export interface PlannerPart {
  sku: string;
  name: string;
  category: string;
  packSize: number;
  massKg?: number | null;
}

export interface PlannerInverter {
  sku: string;
  name: string;
  batteryMinV: number;
  batteryMaxV: number;
  batteryInputs: number;
  /** Stacks it accepts in parallel when the maker states it; otherwise one per battery input. */
  parallelStacks?: number | null;
  maxBatteryKwh?: number | null;
}

/** How many stacks an inverter takes in parallel: the maker's stated figure, else one per input. */
export function stackLimit(inverter: Pick<PlannerInverter, 'batteryInputs' | 'parallelStacks'>): number {
  return inverter.parallelStacks ?? inverter.batteryInputs;
}

export interface PlanRequest {
  range: PlannerRange;
  parts: Record<string, PlannerPart>;
  /** Modules per stack. When given it wins over targetUsableKwh. */
  modules?: number;
  targetUsableKwh?: number;
  inverter?: PlannerInverter | null;
  /** Stacks in parallel: fixed when given, otherwise 1 for an explicit count or searched for a target. */
  stacks?: number;
}

export type PlanErrorCode =
  | 'modules_out_of_range'
  | 'target_invalid'
  | 'target_unreachable'
  | 'no_fit'
  | 'stacks_out_of_range'
  | 'missing_input'
  | 'unknown_part';

export type InverterFitCode = 'too_low' | 'too_high' | 'too_much_energy' | 'too_many_stacks';

export interface InverterFit {
  fits: boolean;
  reason?: string;
  code?: InverterFitCode;
}

export interface Caution {
  code: string;
  text: string;
  /** The authority the installer should follow, not this product. */
  source: string;
}

export interface StackUnit {
  kind: 'controller' | 'module' | 'feet';
  sku: string | null;
  name: string;
  heightMm: number;
  carriesCells: boolean;
}

export type PlanBomLine = BomLine;

export interface StackPlan {
  stacks: number;
  modulesPerStack: number;
  /** Modules plus the controller when it carries cells, per stack. */
  cellUnitsPerStack: number;
  connection: Connection;
  nominalKwh: number;
  usableKwh: number;
  /** Per stack; parallel stacks share it. */
  nominalVoltage: number;
  maxVoltage: number;
  minVoltage: number;
  /** Whole system, all stacks in parallel. */
  capacityAh: number;
  dvc: Dvc;
  inverterFit: InverterFit | null;
  heightMm: number;
  massKg: number;
  footprintM2: number;
  floorLoadKpa: number;
  throughputMwh: number | null;
  throughputAssumptions: string[];
  equivalentCycles: number | null;
  yearsAtOneCyclePerDay: number | null;
  roundTripEfficiencyPct: number | null;
  chargeEfficiencyPct: number | null;
  dischargeEfficiencyPct: number | null;
  /** Figures the planner had to assume because the datasheet left them out. */
  assumptions: string[];
  cautions: Caution[];
  bom: PlanBomLine[];
  /** One stack, top to bottom, for drawing. */
  units: StackUnit[];
}

export interface PlanError {
  code: PlanErrorCode;
  message: string;
  details?: Record<string, unknown>;
}

export type PlanResult = { ok: true; plan: StackPlan } | { ok: false; error: PlanError };

/** Units heavier than this are a two-person lift (common practice in manual handling). */
export const TEAM_LIFT_KG = 25;

const kwhFormat = new Intl.NumberFormat('en-AU', { maximumFractionDigits: 2 });
const fmt = (n: number) => kwhFormat.format(n);
const plural = (n: number, word: string) => `${n} ${word}${n === 1 ? '' : 's'}`;

function fail(code: PlanErrorCode, message: string, details?: Record<string, unknown>): PlanResult {
  return { ok: false, error: details ? { code, message, details } : { code, message } };
}

function sum(values: number[]): number {
  return values.reduce((acc, v) => acc.plus(v), new Decimal(0)).toNumber();
}

function times(a: number, b: number): number {
  return new Decimal(a).times(b).toNumber();
}

// ---------------------------------------------------------------------------------------
// Electrical figures of one stack

interface StackElectrics {
  nominalV: number;
  maxV: number;
  minV: number;
  ah: number;
  nominalKwh: number;
  usableKwh: number;
  cellUnits: PlannerUnit[];
  assumptions: string[];
}

function cellCount(unit: PlannerUnit, assumptions: string[]): number {
  if (unit.cellsInSeries != null) return unit.cellsInSeries;
  const cells = lfpCellsFromNominal(unit.nominalV);
  assumptions.push(
    `${unit.name}: ${cells} cells in series inferred from ${fmt(unit.nominalV)} V at ${LFP_CELL_NOMINAL_V} V per LFP cell (common practice)`,
  );
  return cells;
}

function unitMaxV(unit: PlannerUnit, assumptions: string[]): number {
  if (unit.maxChargeV != null) return unit.maxChargeV;
  const cells = cellCount(unit, assumptions);
  const volts = lfpMaxChargeVoltage(cells);
  assumptions.push(
    `${unit.name}: full-charge voltage taken as ${cells} × ${LFP_CELL_FULL_V} V = ${fmt(volts)} V (LFP, common practice)`,
  );
  return volts;
}

function unitMinV(unit: PlannerUnit, assumptions: string[]): number {
  if (unit.minOperatingV != null) return unit.minOperatingV;
  const cells = cellCount(unit, assumptions);
  const volts = lfpMinVoltage(cells);
  // 2.5 V is the bottom of the usual cut-off band, so the window we test is the widest.
  assumptions.push(
    `${unit.name}: lowest voltage taken as ${cells} × ${LFP_CELL_CUTOFF_V} V = ${fmt(volts)} V (LFP cut-off, common practice)`,
  );
  return volts;
}

function unitUsableKwh(unit: PlannerUnit, range: PlannerRange, assumptions: string[]): number {
  if (unit.usableKwh == null) {
    const dod = range.defaultDodPct ?? DEFAULT_DOD_PCT;
    const source = range.defaultDodPct == null ? 'planner default' : "the range's figure";
    assumptions.push(`${unit.name}: usable energy taken as nominal × ${dod} % depth of discharge (${source})`);
  }
  return usableKwhOf({ nominalKwh: unitNominalKwh(unit.nominalV, unit.ratedAh), makerUsableKwh: unit.usableKwh, dodPct: range.defaultDodPct });
}

function cellUnitsOf(range: PlannerRange, modulesPerStack: number): PlannerUnit[] {
  const modules: PlannerUnit[] = Array.from({ length: modulesPerStack }, () => range.module);
  return range.controller.carriesCells ? [range.controller, ...modules] : modules;
}

export function stackElectrics(range: PlannerRange, modulesPerStack: number): StackElectrics {
  const notes: string[] = [];
  const cellUnits = cellUnitsOf(range, modulesPerStack);
  // Each distinct unit type only needs its assumptions stated once.
  const types = [...new Set(cellUnits)];
  const maxV = new Map(types.map((u) => [u, unitMaxV(u, notes)]));
  const minV = new Map(types.map((u) => [u, unitMinV(u, notes)]));
  const usable = new Map(types.map((u) => [u, unitUsableKwh(u, range, notes)]));

  const series = range.connection === 'series';
  const voltageOf = (pick: (u: PlannerUnit) => number, unitAlone: number) =>
    series ? sum(cellUnits.map(pick)) : cellUnits.length > 0 ? unitAlone : 0;

  return {
    nominalV: voltageOf((u) => u.nominalV, range.module.nominalV),
    maxV: voltageOf((u) => maxV.get(u)!, maxV.get(range.module) ?? 0),
    minV: voltageOf((u) => minV.get(u)!, minV.get(range.module) ?? 0),
    ah: series ? (cellUnits.length > 0 ? range.module.ratedAh : 0) : sum(cellUnits.map((u) => u.ratedAh)),
    nominalKwh: sum(cellUnits.map((u) => unitNominalKwh(u.nominalV, u.ratedAh))),
    usableKwh: sum(cellUnits.map((u) => usable.get(u)!)),
    cellUnits,
    assumptions: [...new Set(notes)],
  };
}

// ---------------------------------------------------------------------------------------
// Inverter fit

export interface FitInput {
  minVoltage: number;
  maxVoltage: number;
  usableKwh: number;
  stacks: number;
}

/** Checks voltage first: no amount of stacking fixes a battery outside the inverter's window. */
export function checkInverterFit(system: FitInput, inverter: PlannerInverter): InverterFit {
  if (system.minVoltage < inverter.batteryMinV) {
    return {
      fits: false,
      code: 'too_low',
      reason: `The battery's lowest voltage, ${fmt(system.minVoltage)} V, is below ${inverter.name}'s battery minimum of ${fmt(inverter.batteryMinV)} V.`,
    };
  }
  if (system.maxVoltage > inverter.batteryMaxV) {
    return {
      fits: false,
      code: 'too_high',
      reason: `The battery's full-charge voltage, ${fmt(system.maxVoltage)} V, is above ${inverter.name}'s battery maximum of ${fmt(inverter.batteryMaxV)} V.`,
    };
  }
  if (inverter.maxBatteryKwh != null && system.usableKwh > inverter.maxBatteryKwh) {
    return {
      fits: false,
      code: 'too_much_energy',
      reason: `${fmt(system.usableKwh)} kWh usable is more than ${inverter.name} accepts (${fmt(inverter.maxBatteryKwh)} kWh).`,
    };
  }
  if (system.stacks > stackLimit(inverter)) {
    const limit = inverter.parallelStacks != null ? `supports ${plural(inverter.parallelStacks, 'stack')} in parallel` : `takes ${plural(inverter.batteryInputs, 'battery input')}`;
    return {
      fits: false,
      code: 'too_many_stacks',
      reason: `${inverter.name} ${limit}, so it cannot take ${plural(system.stacks, 'stack')} in parallel.`,
    };
  }
  return { fits: true };
}

// ---------------------------------------------------------------------------------------
// Physical build, BOM and cautions

function stackHeightMm(range: PlannerRange, modulesPerStack: number): number {
  return range.baseHeightMm + range.controller.heightMm + modulesPerStack * range.module.heightMm;
}

function stackUnits(range: PlannerRange, modulesPerStack: number): StackUnit[] {
  const unit = (kind: 'controller' | 'module', u: PlannerUnit): StackUnit => ({
    kind,
    sku: u.sku,
    name: u.name,
    heightMm: u.heightMm,
    carriesCells: u.carriesCells,
  });
  return [
    unit('controller', range.controller),
    ...Array.from({ length: modulesPerStack }, () => unit('module', range.module)),
    { kind: 'feet', sku: null, name: 'Feet and base', heightMm: range.baseHeightMm, carriesCells: false },
  ];
}

function partLookup(range: PlannerRange, parts: Record<string, PlannerPart>) {
  // Controller and module usually live in the catalogue too; when not, they are single units.
  const fromUnit = (u: PlannerUnit, category: string): BomPart => ({ sku: u.sku, name: u.name, category, packSize: 1 });
  return (sku: string): BomPart => {
    if (Object.hasOwn(parts, sku)) return parts[sku];
    if (sku === range.controller.sku) return fromUnit(range.controller, 'controller');
    if (sku === range.module.sku) return fromUnit(range.module, 'module');
    throw new Error(`No part for ${sku}; unknown skus are checked before the BOM is built.`);
  };
}

function bomDemands(range: PlannerRange, ctx: BomContext, partFor: (sku: string) => BomPart): BomDemand[] {
  const acrossStacks = ctx.stacks > 1 ? ` × ${plural(ctx.stacks, 'stack')}` : '';
  const builtIn: BomDemand[] = [
    { sku: range.controller.sku, qty: ctx.stacks, reason: `1 per stack${acrossStacks}` },
    {
      sku: range.module.sku,
      qty: ctx.modulesPerStack * ctx.stacks,
      reason: `${plural(ctx.modulesPerStack, 'module')} per stack${acrossStacks}`,
    },
  ];
  const fromRules = range.rules
    .map((rule) => applyBomRule(rule, ctx, partFor(rule.sku)))
    .filter((d): d is BomDemand => d !== null && d.qty > 0);
  return [...builtIn, ...fromRules];
}

function accessoryMassKg(range: PlannerRange, bom: BomLine[], parts: Record<string, PlannerPart>): number {
  // Controllers and modules are weighed as stack units already.
  const skipped = new Set([range.controller.sku, range.module.sku]);
  return sum(
    bom
      .filter((line) => !skipped.has(line.sku))
      .map((line) => times(parts[line.sku]?.massKg ?? 0, line.qtyUnits)),
  );
}

const INSTALL_STANDARDS = 'AS/NZS 5139:2019; AS/NZS 3000:2018';
const BATTERY_STANDARD = 'AS/NZS 5139:2019';

function cautionsFor(plan: {
  dvc: Dvc;
  maxVoltage: number;
  floorLoadKpa: number;
  controller: PlannerUnit;
  module: PlannerUnit;
}): Caution[] {
  const cautions: Caution[] = [
    {
      code: 'licensed_work',
      text: "This plan is for quoting and ordering. Installing a battery is licensed electrical work: the installer follows AS/NZS 5139, AS/NZS 3000, the maker's manual and local rules.",
      source: INSTALL_STANDARDS,
    },
    {
      code: 'location',
      text: 'A pre-assembled battery may not go in a habitable room, a ceiling or roof space, a wall cavity, or on a roof.',
      source: BATTERY_STANDARD,
    },
    {
      code: 'clearance',
      text: 'Keep the clearance zone in front of and above the battery clear of other equipment, openings and ignition sources.',
      source: BATTERY_STANDARD,
    },
    {
      code: 'wall_fixing',
      text: 'Fix the wall brackets into studs or masonry, never into plasterboard alone.',
      source: `${BATTERY_STANDARD}; maker's installation manual`,
    },
    {
      code: 'signage',
      text: 'Fit an ES sign showing the UN number (UN 3480 for lithium-ion batteries) at the switchboard.',
      source: BATTERY_STANDARD,
    },
  ];
  if (plan.dvc !== 'A') {
    cautions.push({
      code: 'cable_protection',
      text: `The battery reaches ${fmt(plan.maxVoltage)} V DC (DVC-${plan.dvc}, above ${DVC_A_MAX_V} V): protect the battery cables mechanically over their whole run.`,
      source: BATTERY_STANDARD,
    });
  }
  if (plan.floorLoadKpa > RESIDENTIAL_FLOOR_KPA) {
    cautions.push({
      code: 'floor_load',
      text: `The system puts about ${fmt(roundTo(plan.floorLoadKpa, 1))} kPa on the floor, more than the ${RESIDENTIAL_FLOOR_KPA} kPa a residential floor is designed for: stand it on a slab or have an engineer check the floor.`,
      source: 'AS/NZS 1170.1 (from memory)',
    });
  }
  const heavy = [plan.module, plan.controller].filter((u) => u.massKg > TEAM_LIFT_KG);
  if (heavy.length > 0) {
    const list = heavy.map((u) => `${u.name} ${fmt(u.massKg)} kg`).join(', ');
    cautions.push({
      code: 'heavy_lift',
      text: `Units over ${TEAM_LIFT_KG} kg (${list}): two-person lift or a lifting aid.`,
      source: 'common practice (manual handling)',
    });
  }
  return cautions;
}

function throughputFor(range: PlannerRange, modulesPerStack: number, stacks: number) {
  const groups: { unit: PlannerUnit; count: number }[] = [{ unit: range.module, count: modulesPerStack * stacks }];
  if (range.controller.carriesCells) groups.unshift({ unit: range.controller, count: stacks });
  const notes: string[] = [];
  const alreadyStated: string[] = []; // usable-energy assumptions are listed with the plan's
  let total = new Decimal(0);
  for (const { unit, count } of groups) {
    // A controller with cells rarely has its own cycle rating; the module's stands in for it.
    const estimate = lifetimeThroughput({
      usableKwh: unitUsableKwh(unit, range, alreadyStated),
      cycleLife: unit.cycleLife ?? range.module.cycleLife,
      eolSohPct: unit.eolSohPct ?? range.module.eolSohPct,
      warrantedMwh: unit.warrantedMwh,
    });
    notes.push(`${unit.name} × ${count}: ${estimate.assumptions.join('; ')}`);
    if (estimate.mwh == null) return { mwh: null, notes };
    total = total.plus(new Decimal(estimate.mwh).times(count));
  }
  return { mwh: total.toNumber(), notes };
}

function buildPlan(
  range: PlannerRange,
  parts: Record<string, PlannerPart>,
  modulesPerStack: number,
  stacks: number,
  inverter: PlannerInverter | null,
): StackPlan {
  const electrics = stackElectrics(range, modulesPerStack);
  const assumptions = [...electrics.assumptions];
  const usableKwh = times(electrics.usableKwh, stacks);
  const dvc = dvcClass(electrics.maxV);
  const heightMm = stackHeightMm(range, modulesPerStack);

  const ctx: BomContext = {
    stacks,
    modulesPerStack,
    cellUnitsPerStack: electrics.cellUnits.length,
    dvc,
    heightMm,
  };
  const partFor = partLookup(range, parts);
  const bom = mergeAndPack(bomDemands(range, ctx, partFor), partFor);

  const unitMass = times(range.controller.massKg + times(modulesPerStack, range.module.massKg), stacks);
  const massKg = unitMass + accessoryMassKg(range, bom, parts);
  const widthMm = Math.max(range.controller.widthMm, range.module.widthMm);
  const depthMm = Math.max(range.controller.depthMm, range.module.depthMm);
  const footprintM2 = new Decimal(widthMm).times(depthMm).dividedBy(1e6).times(stacks).toNumber();
  const floorLoad = footprintM2 > 0 ? floorLoadKpa(massKg, footprintM2) : 0;
  if (footprintM2 <= 0) assumptions.push('no unit width or depth given, so the floor load is not known');

  const throughput = throughputFor(range, modulesPerStack, stacks);
  const cycles = throughput.mwh != null && usableKwh > 0 ? Math.round(equivalentFullCycles(throughput.mwh, usableKwh)) : null;
  const throughputAssumptions = [...throughput.notes];
  if (cycles != null) {
    throughputAssumptions.push('equivalent full cycles = lifetime throughput ÷ usable energy; years at one full cycle a day');
  }

  const rte = range.module.roundTripEfficiencyPct ?? null;
  const split = rte != null ? splitRoundTripEfficiency(rte) : null;
  if (split) assumptions.push('charge and discharge efficiency each taken as √(round-trip efficiency)');

  const maxVoltage = roundTo(electrics.maxV);
  const minVoltage = roundTo(electrics.minV);
  return {
    stacks,
    modulesPerStack,
    cellUnitsPerStack: electrics.cellUnits.length,
    connection: range.connection,
    nominalKwh: roundTo(times(electrics.nominalKwh, stacks)),
    usableKwh: roundTo(usableKwh),
    nominalVoltage: roundTo(electrics.nominalV),
    maxVoltage,
    minVoltage,
    capacityAh: roundTo(times(electrics.ah, stacks)),
    dvc,
    inverterFit: inverter ? checkInverterFit({ minVoltage, maxVoltage, usableKwh, stacks }, inverter) : null,
    heightMm,
    massKg: roundTo(massKg),
    footprintM2: roundTo(footprintM2, 4),
    floorLoadKpa: roundTo(floorLoad),
    throughputMwh: throughput.mwh != null ? roundTo(throughput.mwh) : null,
    throughputAssumptions,
    equivalentCycles: cycles,
    yearsAtOneCyclePerDay: cycles != null ? roundTo(yearsAtOneCyclePerDay(cycles), 1) : null,
    roundTripEfficiencyPct: rte,
    chargeEfficiencyPct: split ? roundTo(split.chargePct) : null,
    dischargeEfficiencyPct: split ? roundTo(split.dischargePct) : null,
    assumptions: [...new Set(assumptions)],
    cautions: cautionsFor({ dvc, maxVoltage, floorLoadKpa: floorLoad, controller: range.controller, module: range.module }),
    bom,
    units: stackUnits(range, modulesPerStack),
  };
}

// ---------------------------------------------------------------------------------------
// Choosing the layout

function isWhole(n: unknown): n is number {
  return typeof n === 'number' && Number.isInteger(n);
}

function checkStacks(range: PlannerRange, stacks: unknown): PlanResult | null {
  if (isWhole(stacks) && stacks >= 1 && stacks <= range.maxStacks) return null;
  const allowed = range.maxStacks === 1 ? 'only one stack' : `1 to ${range.maxStacks} stacks in parallel`;
  return fail('stacks_out_of_range', `This range allows ${allowed}; you asked for ${String(stacks)}.`, {
    min: 1,
    max: range.maxStacks,
    requested: stacks,
  });
}

function checkModules(range: PlannerRange, modules: unknown): PlanResult | null {
  if (isWhole(modules) && modules >= range.minModules && modules <= range.maxModules) return null;
  return fail(
    'modules_out_of_range',
    `This range takes ${range.minModules} to ${range.maxModules} modules per stack; you asked for ${String(modules)}.`,
    { min: range.minModules, max: range.maxModules, requested: modules },
  );
}

function checkParts(range: PlannerRange, parts: Record<string, PlannerPart>): PlanResult | null {
  const missing = unknownRuleSkus(range.rules, parts);
  if (missing.length === 0) return null;
  return fail(
    'unknown_part',
    `The BOM rules of ${range.name} refer to ${missing.length === 1 ? 'a part' : 'parts'} not in the catalogue: ${missing.join(', ')}.`,
    { skus: missing },
  );
}

interface Layout {
  modulesPerStack: number;
  stacks: number;
  electrics: StackElectrics;
  usableKwh: number;
}

/** Every layout within the range's limits, fewest stacks first, then fewest modules. */
function layouts(range: PlannerRange, stackOptions: number[]): Layout[] {
  const perModuleCount = new Map<number, StackElectrics>();
  for (let n = range.minModules; n <= range.maxModules; n++) perModuleCount.set(n, stackElectrics(range, n));
  return stackOptions.flatMap((stacks) =>
    [...perModuleCount].map(([modulesPerStack, electrics]) => ({
      modulesPerStack,
      stacks,
      electrics,
      usableKwh: times(electrics.usableKwh, stacks),
    })),
  );
}

function layoutFit(layout: Layout, inverter: PlannerInverter): InverterFit {
  return checkInverterFit(
    {
      minVoltage: roundTo(layout.electrics.minV),
      maxVoltage: roundTo(layout.electrics.maxV),
      usableKwh: layout.usableKwh,
      stacks: layout.stacks,
    },
    inverter,
  );
}

/** Joins a standalone reason into a sentence; names (of inverters) keep their capitals. */
function lowerFirst(text: string): string {
  return text.replace(/^The /, 'the ');
}

function describeLayout(layout: Layout): string {
  return `${plural(layout.modulesPerStack, 'module')} per stack × ${plural(layout.stacks, 'stack')}`;
}

function sizeForTarget(req: PlanRequest, target: number): PlanResult {
  const { range } = req;
  const inverter = req.inverter ?? null;
  const stackOptions = req.stacks !== undefined ? [req.stacks] : Array.from({ length: range.maxStacks }, (_, i) => i + 1);
  const reaching = layouts(range, stackOptions).filter((l) => l.usableKwh >= target);

  if (reaching.length === 0) {
    const most = layouts(range, [Math.max(...stackOptions)]).at(-1);
    const mostKwh = most ? fmt(roundTo(most.usableKwh)) : '0';
    const layoutText = most ? ` (${describeLayout(most)})` : '';
    return fail(
      'target_unreachable',
      `The most ${range.name} reaches is ${mostKwh} kWh usable${layoutText}; you asked for ${fmt(target)} kWh.`,
      { targetUsableKwh: target, maxUsableKwh: most ? roundTo(most.usableKwh) : 0 },
    );
  }

  if (!inverter) {
    const best = reaching[0];
    return { ok: true, plan: buildPlan(range, req.parts, best.modulesPerStack, best.stacks, null) };
  }

  const fitting = reaching.find((l) => layoutFit(l, inverter).fits);
  if (fitting) {
    return { ok: true, plan: buildPlan(range, req.parts, fitting.modulesPerStack, fitting.stacks, inverter) };
  }

  // Explain with the smallest layout that reaches the target; list every other reason seen.
  const first = reaching[0];
  const firstFit = layoutFit(first, inverter);
  const codes = [...new Set(reaching.map((l) => layoutFit(l, inverter).code))];
  return fail(
    'no_fit',
    `No layout of ${range.name} reaching ${fmt(target)} kWh fits ${inverter.name}; the smallest (${describeLayout(first)}) fails because ${lowerFirst(firstFit.reason ?? '')}`,
    {
      reason: firstFit.code,
      reasons: codes,
      targetUsableKwh: target,
      smallestLayout: { modulesPerStack: first.modulesPerStack, stacks: first.stacks },
      inverterWindowV: [inverter.batteryMinV, inverter.batteryMaxV],
      batteryInputs: inverter.batteryInputs,
      parallelStacks: stackLimit(inverter),
      maxBatteryKwh: inverter.maxBatteryKwh ?? null,
    },
  );
}

/**
 * Plan a battery system. With `modules` the layout is taken as asked and an inverter that
 * does not suit it is reported in `inverterFit`; with `targetUsableKwh` the planner picks
 * the fewest stacks, then the fewest modules, that reach the target and suit the inverter.
 */
export function planStack(req: PlanRequest): PlanResult {
  const { range } = req;
  if (req.modules === undefined && req.targetUsableKwh === undefined) {
    return fail('missing_input', 'Give either a module count per stack or a usable energy target in kWh.');
  }
  if (req.stacks !== undefined) {
    const stacksError = checkStacks(range, req.stacks);
    if (stacksError) return stacksError;
  }

  if (req.modules !== undefined) {
    const modulesError = checkModules(range, req.modules);
    if (modulesError) return modulesError;
    const partsError = checkParts(range, req.parts);
    if (partsError) return partsError;
    return { ok: true, plan: buildPlan(range, req.parts, req.modules, req.stacks ?? 1, req.inverter ?? null) };
  }

  const target = req.targetUsableKwh;
  if (typeof target !== 'number' || !Number.isFinite(target) || target <= 0) {
    return fail('target_invalid', `The usable energy target must be a number of kWh above 0; you gave ${String(target)}.`, {
      requested: target,
    });
  }
  const partsError = checkParts(range, req.parts);
  if (partsError) return partsError;
  return sizeForTarget(req, target);
}
