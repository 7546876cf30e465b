// BOM rules are data stored on a range, not formulas: a small closed vocabulary of bases and
// conditions that a product manager can edit and the planner can explain line by line.
import { z } from 'zod';
import { text } from '../contracts/text.ts';
import { DVC_A_MAX_V, type Dvc } from './energy.ts';
import { COUNTRIES, COUNTRY_LABELS, DEFAULT_SITE, FLOORS, FLOOR_LABELS, LOCATIONS, LOCATION_LABELS, MAX_CABLE_RUN_M, WALLS, WALL_LABELS, type Site } from './site.ts';

export const BOM_BASES = ['per-system', 'per-stack', 'per-module', 'per-cell-unit', 'per-n-modules', 'per-stack-link', 'per-metre-of-run'] as const;
export type BomBasis = (typeof BOM_BASES)[number];

const runMetres = z.number().min(0).max(MAX_CABLE_RUN_M);

export const BomConditionSchema = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('always') }),
  z.object({ kind: z.literal('dvc-b-or-c') }),
  z.object({ kind: z.literal('multi-stack') }),
  z.object({ kind: z.literal('height-over'), mm: z.number().int().positive() }),
  // Site and inverter: what the installer told the planner about the job.
  z.object({ kind: z.literal('wall'), wall: z.enum(WALLS) }),
  z.object({ kind: z.literal('location'), location: z.enum(LOCATIONS) }),
  z.object({ kind: z.literal('shares-habitable-wall') }),
  z.object({ kind: z.literal('floor'), floor: z.enum(FLOORS) }),
  z.object({ kind: z.literal('country'), country: z.enum(COUNTRIES) }),
  z.object({ kind: z.literal('stacks-over-inputs') }),
  z
    .object({ kind: z.literal('run-within'), overM: runMetres, upToM: runMetres })
    .refine((c) => c.upToM > c.overM, { message: 'The upper length must be above the lower one.', path: ['upToM'] }),
]);
export type BomCondition = z.infer<typeof BomConditionSchema>;

export const BomRuleSchema = z
  .object({
    sku: text().min(1).max(64),
    basis: z.enum(BOM_BASES),
    qty: z.number().int().positive().max(1000),
    divisor: z.number().int().positive().max(100).optional(),
    when: BomConditionSchema.default({ kind: 'always' }),
  })
  .refine((rule) => rule.basis !== 'per-n-modules' || rule.divisor !== undefined, {
    message: 'A per-n-modules rule needs a divisor (how many modules share one part).',
    path: ['divisor'],
  });
export type BomRule = z.infer<typeof BomRuleSchema>;
export type BomRuleInput = z.input<typeof BomRuleSchema>;

export const BomRulesSchema = z.array(BomRuleSchema).max(100);

/** The inverter as a rule sees it: how many stacks it takes directly. */
export interface BomInverter {
  name: string;
  batteryInputs: number;
}

/** What a rule can look at about the system being planned, its site and its inverter. */
export interface BomContext {
  stacks: number;
  modulesPerStack: number;
  /** Modules, plus the controller when it carries cells. */
  cellUnitsPerStack: number;
  dvc: Dvc;
  heightMm: number;
  /** The site with defaults filled in; the defaults when not given. */
  site?: Site;
  /** The chosen inverter; with none chosen a rule assumes one battery input. */
  inverter?: BomInverter | null;
}

export interface BomPart {
  sku: string;
  name: string;
  category: string;
  packSize: number;
  /** Per sold pack: a pack of 4 feet weighing 1.6 kg has massKg 1.6. */
  massKg?: number | null;
  /** Metres one unit provides (cable sets, covers, conduit sold by the metre or in lengths). */
  lengthM?: number | null;
  /** List price of one sold pack, ex GST, in cents. */
  listPriceCents?: number | null;
}

/** One reason to order some units of a part, before merging and pack rounding. */
export interface BomDemand {
  sku: string;
  qty: number;
  reason: string;
  /** The rule's number in the range (from 1), when a rule asked for it. */
  ruleNumber?: number;
}

export interface BomLine {
  sku: string;
  name: string;
  category: string;
  /** Units the rules call for, before rounding up to whole packs. */
  qtyNeeded: number;
  /** Units ordered: whole packs × pack size. */
  qtyUnits: number;
  packSize: number;
  packs: number;
  /** One sentence explaining the whole line. */
  reason: string;
  /** The reason each contributing rule gave. */
  rules: string[];
  /** The range's rules (numbered from 1) that put this line here; empty for the stack's own units. */
  ruleNumbers: number[];
  /** Metres the line provides, for cables, covers and conduit. */
  lengthM?: number;
}

const numberFormat = new Intl.NumberFormat('en-AU');

function count(n: number, singular: string, pluralForm = `${singular}s`): string {
  return `${numberFormat.format(n)} ${n === 1 ? singular : pluralForm}`;
}

function timesStacks(ctx: BomContext): string {
  return ctx.stacks > 1 ? ` × ${count(ctx.stacks, 'stack')}` : '';
}

const metreFormat = new Intl.NumberFormat('en-AU', { maximumFractionDigits: 2 });
const m = (n: number) => `${metreFormat.format(n)} m`;

const siteOf = (ctx: BomContext): Site => ctx.site ?? DEFAULT_SITE;
/** Stacks the inverter takes directly; with no inverter chosen, one input is assumed (the common case). */
const inputsOf = (ctx: BomContext): number => ctx.inverter?.batteryInputs ?? 1;

export function conditionHolds(condition: BomCondition, ctx: BomContext): boolean {
  const site = siteOf(ctx);
  switch (condition.kind) {
    case 'always':
      return true;
    case 'dvc-b-or-c':
      return ctx.dvc !== 'A';
    case 'multi-stack':
      return ctx.stacks > 1;
    case 'height-over':
      return ctx.heightMm > condition.mm;
    case 'wall':
      return site.wall === condition.wall;
    case 'location':
      return site.location === condition.location;
    case 'shares-habitable-wall':
      return site.sharesHabitableWall;
    case 'floor':
      return site.floor === condition.floor;
    case 'country':
      return site.country === condition.country;
    case 'stacks-over-inputs':
      return ctx.stacks > inputsOf(ctx);
    case 'run-within':
      return site.cableRunM > condition.overM && site.cableRunM <= condition.upToM;
  }
}

/** The catalogue's category code for cable-protection covers. */
export const CABLE_COVER_CATEGORY = 'cable-cover';

/** Covers, and conduit sold by length, protect cables: their DVC reason says why. */
function isCableProtection(part: BomPart | undefined): boolean {
  return part?.category === CABLE_COVER_CATEGORY || (part?.category === 'accessory' && part.lengthM != null);
}

/** Why a condition applies, in the installer's terms; null for rules that always apply. */
export function describeCondition(condition: BomCondition, ctx: BomContext, part?: BomPart): string | null {
  switch (condition.kind) {
    case 'always':
      return null;
    case 'dvc-b-or-c':
      return isCableProtection(part)
        ? `battery above ${DVC_A_MAX_V} V DC (DVC-${ctx.dvc}): cables need mechanical protection over their whole run (AS/NZS 5139:2019)`
        : `battery above ${DVC_A_MAX_V} V DC (DVC-${ctx.dvc})`;
    case 'multi-stack':
      return `${count(ctx.stacks, 'stack')} in parallel`;
    case 'height-over':
      return `stack ${numberFormat.format(ctx.heightMm)} mm tall, over ${numberFormat.format(condition.mm)} mm`;
    case 'wall':
    case 'location':
    case 'floor':
    case 'country':
      // The site fact itself is the reason.
      return conditionLabel(condition);
    case 'shares-habitable-wall':
      return 'the wall is shared with a habitable room: a non-combustible barrier behind the battery';
    case 'stacks-over-inputs': {
      const inverter = ctx.inverter ? `${ctx.inverter.name} has ${count(ctx.inverter.batteryInputs, 'battery input')}` : 'no inverter chosen, so 1 battery input assumed';
      return `${count(ctx.stacks, 'stack')} and ${inverter}: the stacks are joined before the inverter`;
    }
    case 'run-within': {
      const run = siteOf(ctx).cableRunM;
      return condition.overM > 0
        ? `${m(run)} cable run, over ${m(condition.overM)} and up to ${m(condition.upToM)}`
        : `${m(run)} cable run, up to ${m(condition.upToM)}`;
    }
  }
}

/** The condition in the range editor's words, without a system to apply it to. */
export function conditionLabel(condition: BomCondition): string {
  switch (condition.kind) {
    case 'always':
      return 'always';
    case 'dvc-b-or-c':
      return `battery above ${DVC_A_MAX_V} V DC (DVC-B or C)`;
    case 'multi-stack':
      return 'more than one stack';
    case 'height-over':
      return `stack taller than ${numberFormat.format(condition.mm)} mm`;
    case 'wall':
      return `on a ${WALL_LABELS[condition.wall]}`;
    case 'location':
      return LOCATION_LABELS[condition.location];
    case 'shares-habitable-wall':
      return 'wall shared with a habitable room';
    case 'floor':
      return `on a ${FLOOR_LABELS[condition.floor]}`;
    case 'country':
      return `in ${COUNTRY_LABELS[condition.country]}`;
    case 'stacks-over-inputs':
      return "more stacks than the inverter's battery inputs";
    case 'run-within':
      return condition.overM > 0 ? `cable run over ${m(condition.overM)}, up to ${m(condition.upToM)}` : `cable run up to ${m(condition.upToM)}`;
  }
}

/** Quantity a rule calls for and the arithmetic behind it, ignoring its condition. */
export function basisQuantity(rule: BomRule, ctx: BomContext, part?: BomPart): { qty: number; reason: string } {
  const { qty } = rule;
  switch (rule.basis) {
    case 'per-stack-link': {
      // A daisy chain: each stack links to the next, so one link fewer than stacks.
      const links = Math.max(0, ctx.stacks - 1);
      return { qty: qty * links, reason: `${qty} per link between stacks: ${count(ctx.stacks, 'stack')} → ${count(links, 'link')}` };
    }
    case 'per-metre-of-run': {
      // Metres needed over the whole run, rounded up to what one unit provides (1 m, a 4 m length…).
      const run = siteOf(ctx).cableRunM;
      const metresNeeded = qty * run;
      const each = part?.lengthM && part.lengthM > 0 ? part.lengthM : 1;
      const units = Math.ceil(metresNeeded / each - 1e-9);
      const need = qty === 1 ? `the whole ${m(run)} cable run` : `${qty} × the ${m(run)} cable run = ${m(metresNeeded)}`;
      const sold = each === 1 ? `${count(units, 'metre')}, rounded up to whole metres` : `in ${m(each)} lengths → ${units}`;
      return { qty: units, reason: `${need}: ${sold}` };
    }
    case 'per-system':
      return { qty, reason: `${qty} per system` };
    case 'per-stack':
      return { qty: qty * ctx.stacks, reason: `${qty} per stack${timesStacks(ctx)}` };
    case 'per-module': {
      const perStack = qty * ctx.modulesPerStack;
      const modules = ctx.stacks > 1 ? `${count(ctx.modulesPerStack, 'module')} per stack` : count(ctx.modulesPerStack, 'module');
      return { qty: perStack * ctx.stacks, reason: `${qty} per module × ${modules}${timesStacks(ctx)}` };
    }
    case 'per-cell-unit': {
      const units = ctx.stacks > 1 ? `${count(ctx.cellUnitsPerStack, 'unit')} per stack` : count(ctx.cellUnitsPerStack, 'unit');
      return { qty: qty * ctx.cellUnitsPerStack * ctx.stacks, reason: `${qty} per cell-carrying unit × ${units}${timesStacks(ctx)}` };
    }
    case 'per-n-modules': {
      if (rule.divisor === undefined) {
        throw new RangeError(`BOM rule for ${rule.sku} is per-n-modules but has no divisor.`);
      }
      const groups = Math.ceil(ctx.modulesPerStack / rule.divisor);
      const perStack = qty * groups;
      const rounded = ctx.modulesPerStack % rule.divisor !== 0 ? ', rounded up' : '';
      const perStackWord = ctx.stacks > 1 ? ' per stack' : '';
      return {
        qty: perStack * ctx.stacks,
        reason: `${qty} per ${count(rule.divisor, 'module')}${rounded}: ${count(ctx.modulesPerStack, 'module')} → ${perStack}${perStackWord}${timesStacks(ctx)}`,
      };
    }
  }
}

/** What one rule asks for in this system, or null when its condition does not hold. */
export function applyBomRule(rule: BomRule, ctx: BomContext, part?: BomPart, ruleNumber?: number): BomDemand | null {
  if (!conditionHolds(rule.when, ctx)) return null;
  const { qty, reason } = basisQuantity(rule, ctx, part);
  const condition = describeCondition(rule.when, ctx, part);
  const demand: BomDemand = { sku: rule.sku, qty, reason: condition ? `${reason} — ${condition}` : reason };
  if (ruleNumber !== undefined) demand.ruleNumber = ruleNumber;
  return demand;
}

/**
 * Where a range offers parts in lengths to choose from by cable run (rules with a run-within
 * condition), one of them must reach the run; otherwise the plan cannot be built as asked.
 * Returns, per part category with such rules, the longest run they cover when none holds.
 */
export function unreachedRuns(rules: BomRule[], ctx: BomContext, partFor: (sku: string) => BomPart): { category: string; longestM: number; names: string[] }[] {
  const byCategory = new Map<string, { holds: boolean; longestM: number; names: string[] }>();
  for (const rule of rules) {
    if (rule.when.kind !== 'run-within') continue;
    const part = partFor(rule.sku);
    const entry = byCategory.get(part.category) ?? { holds: false, longestM: 0, names: [] };
    entry.holds ||= conditionHolds(rule.when, ctx);
    entry.longestM = Math.max(entry.longestM, rule.when.upToM);
    entry.names.push(part.name);
    byCategory.set(part.category, entry);
  }
  return [...byCategory].filter(([, e]) => !e.holds).map(([category, e]) => ({ category, longestM: e.longestM, names: e.names }));
}

/** Rule skus with no matching part, in rule order without repeats. */
export function unknownRuleSkus(rules: BomRule[], parts: Record<string, BomPart>): string[] {
  const missing = rules.map((rule) => rule.sku).filter((sku) => !Object.hasOwn(parts, sku));
  return [...new Set(missing)];
}

function packNote(qtyNeeded: number, packSize: number, packs: number): string | null {
  if (packSize <= 1) return null;
  const qtyUnits = packs * packSize;
  return qtyUnits === qtyNeeded
    ? `sold in packs of ${packSize}: ${count(packs, 'pack')}`
    : `sold in packs of ${packSize}, rounded up: ${qtyNeeded} → ${qtyUnits} (${count(packs, 'pack')})`;
}

/**
 * Merge demands for the same part, then round each part up to whole packs. Rounding after
 * merging means two rules for a pack-sold part never each round up and over-order.
 * Lines keep the order in which each part was first asked for.
 */
export function mergeAndPack(demands: BomDemand[], partFor: (sku: string) => BomPart): BomLine[] {
  const bySku = new Map<string, { qty: number; rules: string[]; ruleNumbers: number[] }>();
  for (const demand of demands) {
    const entry = bySku.get(demand.sku) ?? { qty: 0, rules: [], ruleNumbers: [] };
    entry.qty += demand.qty;
    entry.rules.push(demand.reason);
    if (demand.ruleNumber !== undefined) entry.ruleNumbers.push(demand.ruleNumber);
    bySku.set(demand.sku, entry);
  }
  return [...bySku].map(([sku, { qty, rules, ruleNumbers }]) => {
    const part = partFor(sku);
    // A pack size below 1 would be bad data; treating it as loose units never under-orders.
    const packSize = Math.max(1, Math.floor(part.packSize));
    const packs = Math.ceil(qty / packSize);
    const sentences = [...rules];
    if (rules.length > 1) sentences.push(`${qty} in all`);
    const note = packNote(qty, packSize, packs);
    if (note) sentences.push(note);
    const line: BomLine = {
      sku,
      name: part.name,
      category: part.category,
      qtyNeeded: qty,
      qtyUnits: packs * packSize,
      packSize,
      packs,
      reason: sentences.join('; '),
      rules,
      ruleNumbers,
    };
    if (part.lengthM != null && part.lengthM > 0) line.lengthM = Number((part.lengthM * packs * packSize).toFixed(3));
    return line;
  });
}
