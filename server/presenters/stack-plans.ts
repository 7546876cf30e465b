import type { RangeDetail, SavedPlan, StackPlanResult } from '@shared/contracts/stack-plans.ts';
import { CATEGORY_LABELS, type CategoryCode } from '@shared/contracts/part-attributes.ts';
import { centsToDollars } from '@shared/domain/money.ts';
import { inverterFrom, type PlannerService } from '../services/planner.ts';

type SavedRow = Awaited<ReturnType<PlannerService['findPlan']>>;

export function presentSavedPlan(r: SavedRow): SavedPlan {
  const s = r.summary as { usableKwh: number; modulesPerStack: number; stacks: number };
  return {
    id: r.id,
    name: r.name,
    status: r.status,
    companyId: r.companyId,
    companyName: r.companyName,
    siteSuburb: r.siteSuburb,
    sitePostcode: r.sitePostcode,
    request: r.request as Record<string, unknown>,
    rangeName: r.rangeName,
    usableKwh: s.usableKwh,
    modulesPerStack: s.modulesPerStack,
    stacks: s.stacks,
    createdBy: r.createdBy,
    createdAt: r.createdAt.toISOString(),
  };
}

export function presentRangeDetail(d: Awaited<ReturnType<PlannerService['rangeDetail']>>): RangeDetail {
  const r = d.row;
  return {
    id: r.id,
    code: r.code,
    name: r.name,
    maker: d.makerCode,
    makerName: d.makerName,
    connection: r.connection,
    minModules: r.minModules,
    maxModules: r.maxModules,
    maxStacks: r.maxStacks,
    baseHeightMm: r.baseHeightMm,
    defaultDodPct: r.defaultDodPct,
    controllerSku: d.controller.sku,
    moduleSku: d.module.sku,
    inverterSkus: d.inverters.map((i) => i.sku),
    rules: d.planner.rules,
    planner: {
      range: d.planner as unknown as Record<string, unknown>,
      parts: d.parts,
      inverters: d.inverters.map(inverterFrom),
    },
    abilities: { edit: d.canEdit },
  };
}

/** A plan's BOM as CSV rows: the lines, then subtotal, GST and total in the line-total column. */
export function bomCsvRows(plan: StackPlanResult) {
  const money = (cents: number | null) => (cents == null ? '' : centsToDollars(cents));
  const lines = plan.bom.map((l) => ({
    SKU: l.sku,
    Part: l.name,
    Category: CATEGORY_LABELS[l.category as CategoryCode] ?? l.category,
    'Qty (units)': l.qtyUnits,
    'Pack size': l.packSize,
    Packs: l.packs,
    'Length (m)': l.lengthM ?? '',
    'Unit price ex GST': money(l.unitPriceCents),
    'Line total ex GST': money(l.lineTotalCents),
    Available: l.available,
    Short: l.short,
    Rules: l.ruleNumbers.join(' '),
    Why: l.reason,
  }));
  // The totals follow the lines, in the line-total column, so a spreadsheet sums what we did.
  const total = (label: string, cents: number) => ({ ...Object.fromEntries(Object.keys(lines[0] ?? {}).map((k) => [k, ''])), Part: label, 'Line total ex GST': money(cents) });
  return [...lines, total('Subtotal ex GST', plan.totals.subtotalCents), total('GST 10 %', plan.totals.gstCents), total('Total inc GST', plan.totals.totalCents)];
}
