// The stack planner: from a range and a module count (or an energy target) to voltages,
// energy, physical size, a bill of materials with reasons, and the cautions that apply.
// Pure and synchronous so the client can preview as the user types and the server can
// recompute the same plan as the authority.
import Decimal from 'decimal.js';
import {
  applyBomRule,
  mergeAndPack,
  unknownRuleSkus,
  unreachedRuns,
  type BomContext,
  type BomDemand,
  type BomLine,
  type BomPart,
  type BomRule,
} from './bom-rules.ts';
import {
  CLEARANCES,
  FLOOR_STANDARD,
  LOCATION_LABELS,
  PROHIBITED_PLACES,
  REQUIRED_SIGNS,
  RESIDENTIAL_FLOOR_POINT_KN,
  SEISMIC_STANDARD,
  ipUnsuited,
  resolveSite,
  type Site,
  type SiteInput,
} from './site.ts';
import { pricedLineTotal, quoteTotals, type QuoteTotals } from './quote.ts';
import {
  DEFAULT_DOD_PCT,
  DVC_A_MAX_V,
  STANDARD_GRAVITY,
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
  /** Enclosure rating, e.g. "IP55"; decides which locations the unit suits. */
  ipRating?: string | null;
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
  /** Inverters the maker lists for this range; another inverter is planned with a warning. */
  inverterSkus?: string[];
}

/** A catalogue part as the planner sees it (mass per sold pack). */
export type PlannerPart = BomPart;

export type PartLifecycle = 'active' | 'superseded' | 'discontinued';

export interface PlannerInverter {
  sku: string;
  name: string;
  batteryMinV: number;
  batteryMaxV: number;
  batteryInputs: number;
  /** Stacks it accepts in parallel when the maker states it; otherwise one per battery input. */
  parallelStacks?: number | null;
  maxBatteryKwh?: number | null;
  lifecycle?: PartLifecycle | null;
  /** The successor's SKU when superseded. */
  supersededBy?: string | null;
  /** Ex GST, in cents: priced when the plan includes the inverter as a line. */
  listPriceCents?: number | null;
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
  /** The site; anything left out is assumed (and the plan says what it assumed). */
  site?: SiteInput;
  /** Put the chosen inverter on the BOM as a line of its own. */
  includeInverter?: boolean;
}

export type PlanErrorCode =
  | 'modules_out_of_range'
  | 'target_invalid'
  | 'target_unreachable'
  | 'no_fit'
  | 'stacks_out_of_range'
  | 'missing_input'
  | 'conflicting_input'
  | 'site_unsuitable'
  | 'unknown_part';

export type InverterFitCode = 'too_low' | 'too_high' | 'too_much_energy' | 'too_many_stacks';

export interface InverterFit {
  fits: boolean;
  reason?: string;
  code?: InverterFitCode;
  /** Fits electrically, but: not listed for the range, superseded or discontinued. */
  warnings?: string[];
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

export type PlanBomLine = BomLine & {
  /** Ex GST list price of one sold pack, in cents; null when the catalogue has none. */
  unitPriceCents: number | null;
  /** Packs × unit price, ex GST, in cents. */
  lineTotalCents: number | null;
};

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
  /** Load on each foot in kN (the whole stack's weight when it has no feet). */
  footLoadKn: number;
  /** Estimated lifetime throughput from the formula (usable × cycles × mean state of health). */
  throughputMwh: number | null;
  throughputAssumptions: string[];
  /** The maker's warranted throughput for the system, where the maker states one; a separate promise. */
  warrantedThroughputMwh: number | null;
  /** What the warranted figure covers, in words; null when there is none. */
  warrantedThroughputNote: string | null;
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
  /** The site planned for, with defaults filled in. */
  site: Site;
  /** The site facts the planner assumed because the request left them out. */
  siteAssumed: string[];
  /** Subtotal, GST and total of the priced lines (list prices, ex GST). */
  totals: QuoteTotals;
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

function partLookup(range: PlannerRange, parts: Record<string, PlannerPart>, inverter: PlannerInverter | null) {
  // Controller and module usually live in the catalogue too; when not, they are single units.
  const fromUnit = (u: PlannerUnit, category: string): BomPart => ({ sku: u.sku, name: u.name, category, packSize: 1, massKg: u.massKg });
  return (sku: string): BomPart => {
    if (Object.hasOwn(parts, sku)) return parts[sku];
    if (sku === range.controller.sku) return fromUnit(range.controller, 'controller');
    if (sku === range.module.sku) return fromUnit(range.module, 'module');
    if (inverter && sku === inverter.sku) return { sku, name: inverter.name, category: 'inverter', packSize: 1, listPriceCents: inverter.listPriceCents ?? null };
    throw new Error(`No part for ${sku}; unknown skus are checked before the BOM is built.`);
  };
}

function bomDemands(range: PlannerRange, ctx: BomContext, partFor: (sku: string) => BomPart, inverterLine: PlannerInverter | null): BomDemand[] {
  const acrossStacks = ctx.stacks > 1 ? ` × ${plural(ctx.stacks, 'stack')}` : '';
  const builtIn: BomDemand[] = [
    { sku: range.controller.sku, qty: ctx.stacks, reason: `1 per stack${acrossStacks}` },
    {
      sku: range.module.sku,
      qty: ctx.modulesPerStack * ctx.stacks,
      reason: `${plural(ctx.modulesPerStack, 'module')} per stack${acrossStacks}`,
    },
  ];
  if (inverterLine) builtIn.push({ sku: inverterLine.sku, qty: 1, reason: 'the chosen inverter, included at your request' });
  const fromRules = range.rules
    .map((rule, i) => applyBomRule(rule, ctx, partFor(rule.sku), i + 1))
    .filter((d): d is BomDemand => d !== null && d.qty > 0);
  return [...builtIn, ...fromRules];
}

/**
 * Mass of everything the BOM sends to site except the inverter (which hangs elsewhere):
 * the stack's units as stack units, every other line as sold packs × mass per pack. Wall
 * and floor accessories count too, so the floor figure errs on the heavy side.
 */
function accessoryMassKg(range: PlannerRange, bom: BomLine[], parts: Record<string, PlannerPart>): number {
  const skipped = new Set([range.controller.sku, range.module.sku]);
  return sum(
    bom
      .filter((line) => !skipped.has(line.sku) && line.category !== 'inverter')
      .map((line) => times(parts[line.sku]?.massKg ?? 0, line.packs)),
  );
}

const INSTALL_STANDARDS = 'AS/NZS 5139:2019; AS/NZS 3000:2018';
const BATTERY_STANDARD = 'AS/NZS 5139:2019';
const MAKERS_MANUAL = "the maker's installation manual";

const listOf = (facts: { text: string }[]) => facts.map((f) => f.text).join('; ');

interface CautionInput {
  dvc: Dvc;
  maxVoltage: number;
  connection: Connection;
  floorLoadKpa: number;
  footLoadKn: number;
  feetPerStack: number;
  controller: PlannerUnit;
  module: PlannerUnit;
  site: Site;
  heightMm: number;
}

/** The cautions this system on this site needs, and no others. The standards stay the authority. */
function cautionsFor(plan: CautionInput): Caution[] {
  const { site } = plan;
  const cautions: Caution[] = [
    {
      code: 'licensed_work',
      text: "This plan is for quoting and ordering and defers to the standards and licensed practice. Installing a battery is licensed electrical work: the installer follows AS/NZS 5139, AS/NZS 3000, the maker's manual and local rules, which win over anything here.",
      source: INSTALL_STANDARDS,
    },
    {
      code: 'location',
      text: `A pre-assembled battery system may not be installed ${listOf(PROHIBITED_PLACES)}. Check the spot against the current edition.`,
      source: BATTERY_STANDARD,
    },
    {
      code: 'clearance',
      text: `Keep clear around the battery: ${listOf(CLEARANCES)}.`,
      source: `${BATTERY_STANDARD}; ${MAKERS_MANUAL}`,
    },
  ];
  const lowVoltage = plan.dvc === 'A';
  cautions.push({
    code: 'isolation',
    text: lowVoltage
      ? 'Fit a battery isolator and DC overcurrent protection (fuse or breaker) rated for the prospective fault current between battery and inverter: a 48 V battery can deliver thousands of amps into a short circuit, so both must be rated to interrupt it.'
      : `Fit a DC isolator rated for ${fmt(plan.maxVoltage)} V DC and the battery current, with overcurrent protection, between battery and inverter, so the battery cables can be made safe for work.`,
    source: `${BATTERY_STANDARD}; AS/NZS 3000:2018`,
  });
  const wallText = site.wall === 'masonry' ? 'into the masonry with anchors suited to it' : 'into the studs (locate them; timber or steel)';
  cautions.push({
    code: 'wall_fixing',
    text: `Fix the wall brackets ${wallText}, never into plasterboard alone.`,
    source: MAKERS_MANUAL,
  });
  cautions.push({
    code: 'signage',
    text: `Signs the system needs: ${listOf(REQUIRED_SIGNS)}.`,
    source: `${BATTERY_STANDARD}; AS/NZS 4777.1`,
  });
  if (plan.dvc !== 'A') {
    cautions.push({
      code: 'cable_protection',
      text: `The battery reaches ${fmt(plan.maxVoltage)} V DC (DVC-${plan.dvc}, above ${DVC_A_MAX_V} V): protect the battery cables mechanically over their whole run to the inverter.`,
      source: BATTERY_STANDARD,
    });
  }
  if (site.floor === 'suspended') {
    // AS/NZS 1170.1 Table 3.1 compares two things: a distributed load and a concentrated
    // one. Values recalled from memory (see site.ts); the user is told to confirm anyway.
    const over = plan.floorLoadKpa > RESIDENTIAL_FLOOR_KPA || plan.footLoadKn > RESIDENTIAL_FLOOR_POINT_KN;
    const where = plan.feetPerStack > 0 ? `${fmt(roundTo(plan.footLoadKn, 2))} kN on each of its ${plan.feetPerStack} feet` : `${fmt(roundTo(plan.footLoadKn, 2))} kN where it stands`;
    cautions.push({
      code: 'floor_load',
      text: `On a suspended floor the system puts about ${fmt(roundTo(plan.floorLoadKpa, 1))} kPa over its footprint and ${where}; a residential floor is designed for ${RESIDENTIAL_FLOOR_KPA} kPa spread and ${RESIDENTIAL_FLOOR_POINT_KN} kN concentrated. ${over ? 'That is more than the floor is designed for: stand it on a slab or have the building’s engineer design the support.' : 'Have the building’s engineer confirm the floor carries it.'}`,
      source: FLOOR_STANDARD,
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
  if (site.location === 'garage') {
    cautions.push({
      code: 'vehicle_impact',
      text: 'In a garage or carport, protect the battery from vehicle impact (a bollard or barrier in the path of a car) and keep it out of the parking space.',
      source: `${BATTERY_STANDARD}; ${MAKERS_MANUAL}`,
    });
  }
  if (site.location === 'outdoor') {
    cautions.push({
      code: 'outdoor',
      text: "Outdoors, keep the battery under cover and out of direct sun, within the maker's temperature range, and above flood level.",
      source: MAKERS_MANUAL,
    });
  }
  if (site.sharesHabitableWall) {
    cautions.push({
      code: 'habitable_wall',
      text: 'The wall backs onto a habitable room: fit a non-combustible barrier between the battery and the wall, extending beyond the battery as the standard sets out.',
      source: BATTERY_STANDARD,
    });
  }
  if (site.country === 'NZ') {
    cautions.push({
      code: 'seismic',
      text: `New Zealand: restrain the stack against earthquake movement (top and mid-height restraint to the structure), designed for the site's seismic zone.`,
      source: `${SEISMIC_STANDARD}; ${MAKERS_MANUAL}`,
    });
  }
  return cautions;
}

/**
 * Lifetime throughput from the formula for the whole system: usable × rated cycles × mean
 * state of health (domain.md §2). A cell-carrying controller rarely has its own cycle rating;
 * the module's stands in for it.
 */
function throughputFor(range: PlannerRange, usableKwh: number) {
  const estimate = lifetimeThroughput({
    usableKwh,
    cycleLife: range.module.cycleLife ?? range.controller.cycleLife,
    eolSohPct: range.module.eolSohPct ?? range.controller.eolSohPct,
  });
  return { mwh: estimate.mwh, notes: estimate.assumptions };
}

/** The maker's warranted throughput, summed over the units that state one, and what it covers. */
function warrantedFor(range: PlannerRange, modulesPerStack: number, stacks: number): { mwh: number | null; note: string | null } {
  const groups: { unit: PlannerUnit; count: number }[] = [{ unit: range.module, count: modulesPerStack * stacks }];
  if (range.controller.carriesCells) groups.unshift({ unit: range.controller, count: stacks });
  const stated = groups.filter((g) => g.unit.warrantedMwh != null);
  if (stated.length === 0) return { mwh: null, note: null };
  const mwh = sum(stated.map((g) => times(g.unit.warrantedMwh!, g.count)));
  const parts = stated.map((g) => `${g.count} × ${fmt(g.unit.warrantedMwh!)} MWh (${g.unit.name})`).join(' + ');
  const without = groups.filter((g) => g.unit.warrantedMwh == null).map((g) => g.unit.name);
  const gap = without.length > 0 ? `; the maker states none for the cells in ${without.join(', ')}, so they are not covered by this figure` : '';
  return { mwh, note: `maker's warranted throughput: ${parts}${gap}` };
}

function inverterWarnings(range: PlannerRange, inverter: PlannerInverter): string[] {
  const warnings: string[] = [];
  if (range.inverterSkus && !range.inverterSkus.includes(inverter.sku)) {
    warnings.push(`${inverter.name} is not on ${range.name}'s list of compatible inverters: the battery's voltage window fits, but check with the maker that they talk to each other (comms protocol, firmware) before quoting.`);
  }
  if (inverter.lifecycle === 'superseded') {
    warnings.push(`${inverter.name} is superseded${inverter.supersededBy ? ` by ${inverter.supersededBy}` : ''}: quote the current model unless the customer already has this one.`);
  }
  if (inverter.lifecycle === 'discontinued') {
    warnings.push(`${inverter.name} is discontinued: plan with it only for a customer who already has one.`);
  }
  return warnings;
}

/** Why this site does not suit the range, or null. */
function siteProblem(range: PlannerRange, site: Site, ctx: BomContext, partFor: (sku: string) => BomPart): PlanError | null {
  const units = range.controller.sku === range.module.sku ? [range.module] : [range.controller, range.module];
  for (const unit of units) {
    const why = ipUnsuited(unit.ipRating, site.location);
    if (why) {
      return {
        code: 'site_unsuitable',
        message: `${range.name} cannot go ${LOCATION_LABELS[site.location]}: ${unit.name} (${unit.sku}) is not made for it — ${why}. Choose another location or another range.`,
        details: { location: site.location, sku: unit.sku, ipRating: unit.ipRating ?? null },
      };
    }
  }
  const short = unreachedRuns(range.rules, ctx, partFor);
  if (short.length > 0) {
    const first = short[0]!;
    return {
      code: 'site_unsuitable',
      message: `A ${fmt(site.cableRunM)} m run from battery to inverter is longer than ${range.name}'s rules provide for: the longest is ${fmt(first.longestM)} m (${first.names.at(-1)}). Move the battery closer to the inverter, or have the cable sized for the run.`,
      details: { cableRunM: site.cableRunM, longestM: first.longestM, category: first.category },
    };
  }
  return null;
}

interface BuildOptions {
  inverter: PlannerInverter | null;
  site: Site;
  siteAssumed: string[];
  includeInverter: boolean;
}

function buildPlan(
  range: PlannerRange,
  parts: Record<string, PlannerPart>,
  modulesPerStack: number,
  stacks: number,
  options: BuildOptions,
): PlanResult {
  const { inverter, site } = options;
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
    site,
    inverter: inverter ? { name: inverter.name, batteryInputs: inverter.batteryInputs } : null,
  };
  const partFor = partLookup(range, parts, inverter);
  const problem = siteProblem(range, site, ctx, partFor);
  if (problem) return { ok: false, error: problem };
  const inverterLine = options.includeInverter ? inverter : null;
  const bom: PlanBomLine[] = mergeAndPack(bomDemands(range, ctx, partFor, inverterLine), partFor).map((line) => {
    const unitPriceCents = partFor(line.sku).listPriceCents ?? null;
    return { ...line, unitPriceCents, lineTotalCents: pricedLineTotal({ packs: line.packs, unitPriceCents }) };
  });

  const unitMass = times(range.controller.massKg + times(modulesPerStack, range.module.massKg), stacks);
  const massKg = unitMass + accessoryMassKg(range, bom, parts);
  const widthMm = Math.max(range.controller.widthMm, range.module.widthMm);
  const depthMm = Math.max(range.controller.depthMm, range.module.depthMm);
  const footprintM2 = new Decimal(widthMm).times(depthMm).dividedBy(1e6).times(stacks).toNumber();
  const floorLoad = footprintM2 > 0 ? floorLoadKpa(massKg, footprintM2) : 0;
  if (footprintM2 <= 0) assumptions.push('no unit width or depth given, so the floor load is not known');
  const feetPerStack = Math.floor(sum(bom.filter((l) => l.category === 'feet').map((l) => l.qtyNeeded)) / stacks);
  // Each foot carries an equal share of its stack (common practice for a level, rigid stack).
  const footLoadKn = new Decimal(massKg).times(STANDARD_GRAVITY).dividedBy(1000).dividedBy(stacks * Math.max(1, feetPerStack)).toNumber();

  const throughput = throughputFor(range, usableKwh);
  const cycles = throughput.mwh != null && usableKwh > 0 ? Math.round(equivalentFullCycles(throughput.mwh, usableKwh)) : null;
  const throughputAssumptions = [...throughput.notes];
  if (cycles != null) {
    throughputAssumptions.push('equivalent full cycles = lifetime throughput ÷ usable energy; years at one full cycle a day');
  }
  const warranted = warrantedFor(range, modulesPerStack, stacks);

  const rte = range.module.roundTripEfficiencyPct ?? null;
  const split = rte != null ? splitRoundTripEfficiency(rte) : null;
  if (split) assumptions.push('charge and discharge efficiency each taken as √(round-trip efficiency)');

  const maxVoltage = roundTo(electrics.maxV);
  const minVoltage = roundTo(electrics.minV);
  let inverterFit: InverterFit | null = null;
  if (inverter) {
    inverterFit = checkInverterFit({ minVoltage, maxVoltage, usableKwh, stacks }, inverter);
    const warnings = inverterWarnings(range, inverter);
    if (warnings.length > 0) inverterFit = { ...inverterFit, warnings };
  }
  const cautions = cautionsFor({ dvc, maxVoltage, connection: range.connection, floorLoadKpa: floorLoad, footLoadKn, feetPerStack, controller: range.controller, module: range.module, site, heightMm });
  for (const warning of inverterFit?.warnings ?? []) cautions.push({ code: 'inverter_choice', text: warning, source: MAKERS_MANUAL });
  return {
    ok: true,
    plan: {
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
      inverterFit,
      heightMm,
      massKg: roundTo(massKg),
      footprintM2: roundTo(footprintM2, 4),
      floorLoadKpa: roundTo(floorLoad),
      footLoadKn: roundTo(footLoadKn, 3),
      throughputMwh: throughput.mwh != null ? roundTo(throughput.mwh) : null,
      throughputAssumptions,
      warrantedThroughputMwh: warranted.mwh != null ? roundTo(warranted.mwh) : null,
      warrantedThroughputNote: warranted.note,
      equivalentCycles: cycles,
      yearsAtOneCyclePerDay: cycles != null ? roundTo(yearsAtOneCyclePerDay(cycles), 1) : null,
      roundTripEfficiencyPct: rte,
      chargeEfficiencyPct: split ? roundTo(split.chargePct) : null,
      dischargeEfficiencyPct: split ? roundTo(split.dischargePct) : null,
      assumptions: [...new Set(assumptions)],
      cautions,
      bom,
      units: stackUnits(range, modulesPerStack),
      site,
      siteAssumed: options.siteAssumed,
      totals: quoteTotals(bom),
    },
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

function optionsOf(req: PlanRequest): BuildOptions {
  const { site, assumed } = resolveSite(req.site);
  return { inverter: req.inverter ?? null, site, siteAssumed: assumed, includeInverter: req.includeInverter === true && !!req.inverter };
}

function sizeForTarget(req: PlanRequest, target: number): PlanResult {
  const { range } = req;
  const inverter = req.inverter ?? null;
  const options = optionsOf(req);
  const stackOptions = req.stacks !== undefined ? [req.stacks] : Array.from({ length: range.maxStacks }, (_, i) => i + 1);
  const all = layouts(range, stackOptions);
  const reaching = all.filter((l) => l.usableKwh >= target);

  if (reaching.length === 0) {
    const most = layouts(range, [Math.max(...stackOptions)]).at(-1);
    const mostKwh = most ? fmt(roundTo(most.usableKwh)) : '0';
    const layoutText = most ? ` (${describeLayout(most)})` : '';
    // With an inverter, its ceiling is the one that matters: name it first.
    const fittingAll = inverter ? all.filter((l) => layoutFit(l, inverter).fits) : [];
    const capped = fittingAll.reduce<Layout | null>((best, l) => (!best || l.usableKwh > best.usableKwh ? l : best), null);
    if (inverter && capped) {
      return fail(
        'target_unreachable',
        `With ${inverter.name}, the most ${range.name} reaches is ${fmt(roundTo(capped.usableKwh))} kWh usable (${describeLayout(capped)}); you asked for ${fmt(target)} kWh. The range alone reaches ${mostKwh} kWh with an inverter that takes it.`,
        { targetUsableKwh: target, maxUsableKwh: roundTo(capped.usableKwh), rangeMaxUsableKwh: most ? roundTo(most.usableKwh) : 0, cappedBy: inverter.sku },
      );
    }
    return fail(
      'target_unreachable',
      `The most ${range.name} reaches is ${mostKwh} kWh usable${layoutText}; you asked for ${fmt(target)} kWh.`,
      { targetUsableKwh: target, maxUsableKwh: most ? roundTo(most.usableKwh) : 0 },
    );
  }

  if (!inverter) {
    const best = reaching[0];
    return buildPlan(range, req.parts, best.modulesPerStack, best.stacks, options);
  }

  const fitting = reaching.find((l) => layoutFit(l, inverter).fits);
  if (fitting) {
    return buildPlan(range, req.parts, fitting.modulesPerStack, fitting.stacks, options);
  }

  // The target is within the range but not with this inverter: its own ceiling, if any layout fits at all.
  const fittingAll = all.filter((l) => layoutFit(l, inverter).fits);
  const capped = fittingAll.reduce<Layout | null>((best, l) => (!best || l.usableKwh > best.usableKwh ? l : best), null);
  if (capped) {
    const smallest = layoutFit(reaching[0], inverter);
    return fail(
      'target_unreachable',
      `With ${inverter.name}, the most ${range.name} reaches is ${fmt(roundTo(capped.usableKwh))} kWh usable (${describeLayout(capped)}); you asked for ${fmt(target)} kWh. The smallest layout that reaches it (${describeLayout(reaching[0])}) does not fit: ${lowerFirst(smallest.reason ?? '')} Choose an inverter that takes more, or lower the target.`,
      { targetUsableKwh: target, maxUsableKwh: roundTo(capped.usableKwh), cappedBy: inverter.sku, reason: smallest.code },
    );
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
 * Asking for both is refused: one of them would be silently ignored.
 */
export function planStack(req: PlanRequest): PlanResult {
  const { range } = req;
  if (req.modules === undefined && req.targetUsableKwh === undefined) {
    return fail('missing_input', 'Give either a module count per stack or a usable energy target in kWh.');
  }
  if (req.modules !== undefined && req.targetUsableKwh !== undefined) {
    return fail('conflicting_input', 'Give a module count per stack or a usable energy target, not both: the planner would have to ignore one of them.', {
      modules: req.modules,
      targetUsableKwh: req.targetUsableKwh,
    });
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
    return buildPlan(range, req.parts, req.modules, req.stacks ?? 1, optionsOf(req));
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
