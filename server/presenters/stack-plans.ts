import type { RangeDetail, SavedPlan } from '@shared/contracts/stack-plans.ts';
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
