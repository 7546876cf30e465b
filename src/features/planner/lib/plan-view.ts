// One shape for a plan on screen, whether the browser computed it a moment ago or the
// server answered with availability: the figures, drawing and BOM components read this.
import type { RangeDetail, StackPlanRequest, StackPlanResult } from '@shared/contracts/stack-plans.ts';
import { SiteInputSchema } from '@shared/domain/site.ts';
import { planStack, type PlanError, type PlannerInverter, type PlannerRange, type StackPlan } from '@shared/domain/planner.ts';

export interface LineStock {
  available: number;
  short: number;
  availability: { warehouse: string; warehouseName: string; available: number }[];
}

export type ShownLine = StackPlan['bom'][number] & { stock?: LineStock };

export type ShownPlan = Omit<StackPlan, 'bom' | 'inverterFit'> & {
  bom: ShownLine[];
  inverterFit: { fits: boolean; reason?: string; code?: string; warnings?: string[] } | null;
  unitWidthMm: number;
  /** The viewer's tier discount in the prices; the browser's own plan has list prices (0). */
  discountPct: number;
  /** True once the lines carry the server's stock figures for exactly this plan. */
  confirmed: boolean;
};

export const plannerRangeOf = (detail: RangeDetail) => detail.planner.range as unknown as PlannerRange;

export function unitWidthOf(range: PlannerRange) {
  return Math.max(range.controller.widthMm, range.module.widthMm);
}

/** The browser's own plan, from the range detail's planner payload. */
export function planLocally(detail: RangeDetail, req: StackPlanRequest, inverter: PlannerInverter | null): { ok: true; plan: ShownPlan } | { ok: false; error: PlanError } {
  const range = plannerRangeOf(detail);
  // The same site checks as the server's contract, so a bad run is explained before it is sent.
  const site = SiteInputSchema.safeParse(req.site ?? {});
  if (!site.success) return { ok: false, error: { code: 'site_unsuitable', message: site.error.issues.map((i) => i.message).join(' ') } };
  const result = planStack({
    range,
    parts: detail.planner.parts,
    modules: req.modules,
    targetUsableKwh: req.targetUsableKwh,
    stacks: req.stacks,
    inverter,
    site: site.data,
    includeInverter: req.includeInverter,
  });
  if (!result.ok) return result;
  return { ok: true, plan: { ...result.plan, unitWidthMm: unitWidthOf(range), discountPct: 0, confirmed: false } };
}

export function fromServer(result: StackPlanResult): ShownPlan {
  return {
    ...result,
    confirmed: true,
    bom: result.bom.map(({ available, short, availability, ...line }) => ({ ...line, stock: { available, short, availability } })),
  };
}

/**
 * Stock on hand does not depend on the plan, so an earlier answer's availability per SKU
 * still holds for a new layout: only the shortfall is worked out again.
 */
export function withStockFrom(plan: ShownPlan, earlier: StackPlanResult | undefined): ShownPlan {
  if (!earlier) return plan;
  const bySku = new Map(earlier.bom.map((l) => [l.sku, l]));
  return {
    ...plan,
    bom: plan.bom.map((line) => {
      const known = bySku.get(line.sku);
      if (!known) return line;
      return { ...line, stock: { available: known.available, availability: known.availability, short: Math.max(0, line.qtyUnits - known.available) } };
    }),
  };
}

/** Warehouses named in any line's availability, in the server's order. */
export function warehousesOf(plan: ShownPlan): string[] {
  const seen = new Set<string>();
  for (const line of plan.bom) for (const a of line.stock?.availability ?? []) seen.add(a.warehouse);
  return [...seen];
}

/** Wall brackets per stack, from the BOM's wall-bracket lines (for the drawing). */
export function bracketsPerStack(plan: Pick<ShownPlan, 'bom' | 'stacks'>): number {
  const total = plan.bom.filter((l) => l.category === 'wall-bracket').reduce((n, l) => n + l.qtyNeeded, 0);
  return plan.stacks > 0 ? Math.ceil(total / plan.stacks) : 0;
}
