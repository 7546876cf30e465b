// BOM rules are data stored on a range, not formulas: a small closed vocabulary of bases and
// conditions that a product manager can edit and the planner can explain line by line.
import { z } from 'zod';
import { text } from '../contracts/text.ts';
import { DVC_A_MAX_V, type Dvc } from './energy.ts';

export const BOM_BASES = ['per-system', 'per-stack', 'per-module', 'per-cell-unit', 'per-n-modules'] as const;
export type BomBasis = (typeof BOM_BASES)[number];

export const BomConditionSchema = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('always') }),
  z.object({ kind: z.literal('dvc-b-or-c') }),
  z.object({ kind: z.literal('multi-stack') }),
  z.object({ kind: z.literal('height-over'), mm: z.number().int().positive() }),
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

/** What a rule can look at about the system being planned. */
export interface BomContext {
  stacks: number;
  modulesPerStack: number;
  /** Modules, plus the controller when it carries cells. */
  cellUnitsPerStack: number;
  dvc: Dvc;
  heightMm: number;
}

export interface BomPart {
  sku: string;
  name: string;
  category: string;
  packSize: number;
  massKg?: number | null;
}

/** One reason to order some units of a part, before merging and pack rounding. */
export interface BomDemand {
  sku: string;
  qty: number;
  reason: string;
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
}

const numberFormat = new Intl.NumberFormat('en-AU');

function count(n: number, singular: string, pluralForm = `${singular}s`): string {
  return `${numberFormat.format(n)} ${n === 1 ? singular : pluralForm}`;
}

function timesStacks(ctx: BomContext): string {
  return ctx.stacks > 1 ? ` × ${count(ctx.stacks, 'stack')}` : '';
}

export function conditionHolds(condition: BomCondition, ctx: BomContext): boolean {
  switch (condition.kind) {
    case 'always':
      return true;
    case 'dvc-b-or-c':
      return ctx.dvc !== 'A';
    case 'multi-stack':
      return ctx.stacks > 1;
    case 'height-over':
      return ctx.heightMm > condition.mm;
  }
}

/** The catalogue's category code for cable-protection covers. */
export const CABLE_COVER_CATEGORY = 'cable-cover';

function isCableProtection(part: BomPart | undefined): boolean {
  return part?.category === CABLE_COVER_CATEGORY;
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
  }
}

/** Quantity a rule calls for and the arithmetic behind it, ignoring its condition. */
export function basisQuantity(rule: BomRule, ctx: BomContext): { qty: number; reason: string } {
  const { qty } = rule;
  switch (rule.basis) {
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
export function applyBomRule(rule: BomRule, ctx: BomContext, part?: BomPart): BomDemand | null {
  if (!conditionHolds(rule.when, ctx)) return null;
  const { qty, reason } = basisQuantity(rule, ctx);
  const condition = describeCondition(rule.when, ctx, part);
  return { sku: rule.sku, qty, reason: condition ? `${reason} — ${condition}` : reason };
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
  const bySku = new Map<string, { qty: number; rules: string[] }>();
  for (const demand of demands) {
    const entry = bySku.get(demand.sku) ?? { qty: 0, rules: [] };
    entry.qty += demand.qty;
    entry.rules.push(demand.reason);
    bySku.set(demand.sku, entry);
  }
  return [...bySku].map(([sku, { qty, rules }]) => {
    const part = partFor(sku);
    // A pack size below 1 would be bad data; treating it as loose units never under-orders.
    const packSize = Math.max(1, Math.floor(part.packSize));
    const packs = Math.ceil(qty / packSize);
    const sentences = [...rules];
    if (rules.length > 1) sentences.push(`${qty} in all`);
    const note = packNote(qty, packSize, packs);
    if (note) sentences.push(note);
    return {
      sku,
      name: part.name,
      category: part.category,
      qtyNeeded: qty,
      qtyUnits: packs * packSize,
      packSize,
      packs,
      reason: sentences.join('; '),
      rules,
    };
  });
}
