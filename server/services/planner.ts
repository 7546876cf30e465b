import { and, asc, desc, eq, inArray, or, sql } from 'drizzle-orm';
import type { Db, Tx } from '../db/client.ts';
import { isUuid } from '../db/errors.ts';
import { companies, makers, parts, rangeInverters, ranges, stackPlans, stockLevels, user, warehouses } from '../db/schema/index.ts';
import { authorize, type Actor } from '../policies/actor.ts';
import { companyForNew, companyScopeOf, isCompanyBound } from '../policies/company-scope.ts';
import { can } from '@shared/roles.ts';
import { ConflictError, NotFoundError, ValidationError } from '../errors.ts';
import { createTtlCache, type TtlCache } from '../lib/ttl-cache.ts';
import { planStack, type PlannerInverter, type PlannerPart, type PlannerRange, type PlannerUnit } from '@shared/domain/planner.ts';
import { BomRulesSchema, unknownRuleSkus } from '@shared/domain/bom-rules.ts';
import { StackPlanRequestSchema, type RangeInput, type SavePlanInput, type StackPlanRequest } from '@shared/contracts/stack-plans.ts';
import { pricedLineTotal, quoteTotals, type QuoteTotals } from '@shared/domain/quote.ts';
import { discountedCents } from '@shared/domain/pricing.ts';
import { customerDiscountPct } from './pricing.ts';

type PartRow = typeof parts.$inferSelect;
function unitFrom(p: PartRow): PlannerUnit {
  const a = p.attributes as Record<string, unknown>;
  const n = (k: string) => (typeof a[k] === 'number' ? (a[k] as number) : null);
  const carriesCells = p.category === 'module' || a.carriesCells === true;
  return {
    sku: p.sku,
    name: p.name,
    nominalV: n('nominalV') ?? 0,
    ratedAh: n('ratedAh') ?? 0,
    usableKwh: n('usableKwh'),
    cellsInSeries: n('cellsInSeries'),
    minOperatingV: n('minOperatingV'),
    maxChargeV: n('maxChargeV'),
    heightMm: p.heightMm ?? 0,
    widthMm: p.widthMm ?? 0,
    depthMm: p.depthMm ?? 0,
    massKg: p.massKg,
    cycleLife: n('cycleLife'),
    eolSohPct: n('eolSohPct'),
    warrantedMwh: n('warrantedMwh'),
    roundTripEfficiencyPct: n('roundTripEfficiencyPct'),
    carriesCells,
    ipRating: p.ipRating,
  };
}

export function inverterFrom(p: PartRow): PlannerInverter & { parallelStacks: number | null; maxBatteryKwh: number | null } {
  const a = p.attributes as Record<string, number | undefined>;
  return {
    sku: p.sku,
    name: p.name,
    batteryMinV: a.batteryMinV ?? 0,
    batteryMaxV: a.batteryMaxV ?? 0,
    batteryInputs: a.batteryInputs ?? 1,
    parallelStacks: a.parallelStacks ?? null,
    maxBatteryKwh: a.maxBatteryKwh ?? null,
  };
}

/** The inverter with what the planner warns about (lifecycle) and prices (list price, ex GST). */
function plannerInverterFrom(p: PartRow, successorSku: string | null): PlannerInverter {
  return { ...inverterFrom(p), lifecycle: p.lifecycle, supersededBy: successorSku, listPriceCents: p.listPriceCents };
}

/** Metres one unit provides: the length attribute of cables and covers, 1 for goods sold by the metre. */
function partLengthM(p: PartRow): number | null {
  const length = (p.attributes as Record<string, unknown>).lengthM;
  if (typeof length === 'number' && length > 0) return length;
  return p.unit === 'm' ? 1 : null;
}

/** Mass is per sold pack, list price per sold pack ex GST; cost never leaves the server here. */
const plannerPart = (p: PartRow): PlannerPart => ({
  sku: p.sku,
  name: p.name,
  category: p.category,
  packSize: p.packSize,
  massKg: p.massKg,
  lengthM: partLengthM(p),
  listPriceCents: p.listPriceCents,
});

/** A range with every part its planner needs: controller, module, rule parts and compatible inverters. */
async function readRange(db: Db, idOrCode: string) {
  const [row] = await db
    .select({ range: ranges, makerCode: makers.code, makerName: makers.name })
    .from(ranges)
    .innerJoin(makers, eq(makers.id, ranges.makerId))
    .where(isUuid(idOrCode) ? eq(ranges.id, idOrCode) : eq(ranges.code, idOrCode));
  if (!row) throw new NotFoundError('That range');
  const r = row.range;
  const rules = BomRulesSchema.parse(r.rules);
  const ruleSkus = rules.map((x) => x.sku);
  const [partRows, inverterRows] = await Promise.all([
    db.select().from(parts).where(ruleSkus.length ? or(inArray(parts.id, [r.controllerId, r.moduleId]), inArray(parts.sku, ruleSkus)) : inArray(parts.id, [r.controllerId, r.moduleId])),
    db.select({ part: parts }).from(rangeInverters).innerJoin(parts, eq(parts.id, rangeInverters.inverterId)).where(eq(rangeInverters.rangeId, r.id)).orderBy(asc(parts.sku)),
  ]);
  const controller = partRows.find((p) => p.id === r.controllerId)!;
  const module = partRows.find((p) => p.id === r.moduleId)!;
  const partsBySku: Record<string, PlannerPart> = {};
  for (const p of partRows) partsBySku[p.sku] = plannerPart(p);
  const planner: PlannerRange = {
    id: r.id,
    name: r.name,
    connection: r.connection,
    minModules: r.minModules,
    maxModules: r.maxModules,
    maxStacks: r.maxStacks,
    baseHeightMm: r.baseHeightMm,
    defaultDodPct: r.defaultDodPct,
    controller: unitFrom(controller),
    module: unitFrom(module),
    rules,
    inverterSkus: inverterRows.map((x) => x.part.sku),
  };
  return { row: r, makerCode: row.makerCode, makerName: row.makerName, planner, parts: partsBySku, inverters: inverterRows.map((x) => x.part), controller, module };
}

export type LoadedRange = Awaited<ReturnType<typeof readRange>>;

/** Range definitions change rarely and are read by every plan; instances see an edit within this time. */
export const RANGE_CACHE_MS = 10_000;

export interface PlannerDeps {
  db: Db;
  rangeCache?: TtlCache<LoadedRange>;
  /** Called inside a range edit's transaction with the parts it touched, so their search documents follow (or the edit rolls back). */
  onRangeChanged?: (tx: Tx, partIds: string[]) => Promise<unknown>;
}

export function createPlannerService({ db, rangeCache = createTtlCache<LoadedRange>(RANGE_CACHE_MS), onRangeChanged = async () => {} }: PlannerDeps) {
  const loadRange = (idOrCode: string) => rangeCache.get(idOrCode, () => readRange(db, idOrCode));

  async function successorSku(p: PartRow, known: PartRow[]) {
    if (!p.supersededById) return null;
    const listed = known.find((k) => k.id === p.supersededById);
    if (listed) return listed.sku;
    const [row] = await db.select({ sku: parts.sku }).from(parts).where(eq(parts.id, p.supersededById));
    return row?.sku ?? null;
  }

  async function findInverter(sku: string, known: PartRow[]) {
    const [p] = await db.select().from(parts).where(eq(parts.sku, sku.toUpperCase()));
    if (!p) throw new NotFoundError(`Inverter ${sku}`);
    if (p.category !== 'inverter') throw new ValidationError(`${p.sku} is not an inverter.`, { fields: [{ path: 'inverterSku', message: 'Choose an inverter.' }] });
    return plannerInverterFrom(p, await successorSku(p, known));
  }

  /** Available (on hand − reserved) per SKU and warehouse. */
  async function availability(skus: string[]) {
    if (skus.length === 0) return new Map<string, { warehouse: string; warehouseName: string; available: number }[]>();
    const rows = await db
      .select({ sku: parts.sku, warehouse: warehouses.code, warehouseName: warehouses.name, available: sql<number>`sum(${stockLevels.onHand} - ${stockLevels.reserved})::int` })
      .from(stockLevels)
      .innerJoin(parts, eq(parts.id, stockLevels.partId))
      .innerJoin(warehouses, eq(warehouses.id, stockLevels.warehouseId))
      .where(inArray(parts.sku, skus))
      .groupBy(parts.sku, warehouses.code, warehouses.name, warehouses.rank)
      .orderBy(asc(warehouses.rank));
    const out = new Map<string, { warehouse: string; warehouseName: string; available: number }[]>();
    for (const r of rows) out.set(r.sku, [...(out.get(r.sku) ?? []), { warehouse: r.warehouse, warehouseName: r.warehouseName, available: r.available }]);
    return out;
  }

  async function plan(actor: Actor, input: StackPlanRequest) {
    authorize(actor, 'plans.create');
    return workOut(input, await customerDiscountPct(db, companyScopeOf(actor)));
  }

  /** The plan itself, priced at list less `discountPct`; who may ask is the caller's business. */
  async function workOut(input: StackPlanRequest, discountPct: number) {
    const loaded = await loadRange(input.rangeId);
    // Stock is read for every part the range can call for while the plan is worked out,
    // and a compatible inverter comes from the cached range: one database round trip per plan.
    const sku = input.inverterSku?.toUpperCase();
    const listed = sku ? loaded.inverters.find((p) => p.sku === sku) : undefined;
    const [inverter, stock] = await Promise.all([
      listed ? (listed.supersededById ? successorSku(listed, loaded.inverters).then((s) => plannerInverterFrom(listed, s)) : plannerInverterFrom(listed, null)) : sku ? findInverter(sku, loaded.inverters) : null,
      availability([...Object.keys(loaded.parts), ...(sku && input.includeInverter ? [sku] : [])]),
    ]);
    const result = planStack({
      range: loaded.planner,
      parts: loaded.parts,
      modules: input.modules,
      targetUsableKwh: input.targetUsableKwh,
      inverter,
      stacks: input.stacks,
      site: input.site,
      includeInverter: input.includeInverter,
    });
    if (!result.ok) throw new ValidationError(result.error.message, { code: result.error.code, ...result.error.details });
    const p = atCustomerPrices(result.plan, discountPct);
    return {
      ...p,
      discountPct,
      rangeId: loaded.row.id,
      rangeName: loaded.row.name,
      inverterSku: inverter?.sku ?? null,
      unitWidthMm: Math.max(loaded.planner.controller.widthMm, loaded.planner.module.widthMm),
      bom: p.bom.map((l) => {
        const per = stock.get(l.sku) ?? [];
        const available = per.reduce((s, w) => s + w.available, 0);
        return { ...l, availability: per, available, short: Math.max(0, l.qtyUnits - available) };
      }),
    };
  }

  const planColumns = {
    id: stackPlans.id,
    name: stackPlans.name,
    status: stackPlans.status,
    companyId: stackPlans.companyId,
    companyName: companies.name,
    siteSuburb: stackPlans.siteSuburb,
    sitePostcode: stackPlans.sitePostcode,
    request: stackPlans.request,
    summary: stackPlans.summary,
    rangeName: ranges.name,
    createdBy: user.name,
    createdAt: stackPlans.createdAt,
  };

  /** Installers only ever see their own company's plans: anything else is "not found". */
  const visibleTo = (actor: Actor) => {
    const scope = companyScopeOf(actor);
    return scope === null ? undefined : eq(stackPlans.companyId, scope);
  };

  return {
    plan,

    async save(actor: Actor, input: SavePlanInput) {
      authorize(actor, 'plans.create');
      const result = await plan(actor, input.request);
      // Installers plan for their own company; staff plan for a customer account they name.
      let companyId = companyForNew(actor, input.companyId);
      if (companyId && !isCompanyBound(actor)) {
        const [c] = await db.select().from(companies).where(and(eq(companies.id, companyId), eq(companies.kind, 'installer')));
        companyId = c?.id ?? null;
      }
      if (!companyId) throw new ValidationError('Choose the customer account this plan is for.', { fields: [{ path: 'companyId', message: 'Choose a customer account.' }] });
      const summary = { usableKwh: result.usableKwh, modulesPerStack: result.modulesPerStack, stacks: result.stacks, dvc: result.dvc };
      const [row] = await db
        .insert(stackPlans)
        .values({ companyId, name: input.name, siteSuburb: input.siteSuburb ?? null, sitePostcode: input.sitePostcode ?? null, rangeId: result.rangeId, request: input.request, summary, createdBy: actor.userId })
        .returning({ id: stackPlans.id });
      return this.findPlan(actor, row!.id);
    },

    async listPlans(actor: Actor) {
      authorize(actor, 'plans.create');
      return db
        .select(planColumns)
        .from(stackPlans)
        .innerJoin(companies, eq(companies.id, stackPlans.companyId))
        .innerJoin(ranges, eq(ranges.id, stackPlans.rangeId))
        .innerJoin(user, eq(user.id, stackPlans.createdBy))
        .where(visibleTo(actor))
        .orderBy(desc(stackPlans.createdAt))
        .limit(200);
    },

    async findPlan(actor: Actor, id: string) {
      authorize(actor, 'plans.create');
      if (!isUuid(id)) throw new NotFoundError('That plan');
      const [row] = await db
        .select(planColumns)
        .from(stackPlans)
        .innerJoin(companies, eq(companies.id, stackPlans.companyId))
        .innerJoin(ranges, eq(ranges.id, stackPlans.rangeId))
        .innerJoin(user, eq(user.id, stackPlans.createdBy))
        .where(and(eq(stackPlans.id, id), visibleTo(actor)));
      if (!row) throw new NotFoundError('That plan');
      return row;
    },

    /** Customer accounts staff can plan for. */
    async customers(actor: Actor) {
      authorize(actor, 'customers.view');
      return db.select({ id: companies.id, name: companies.name }).from(companies).where(eq(companies.kind, 'installer')).orderBy(asc(companies.name));
    },

    /** A saved plan recomputed with today's range and stock; a plan its range no longer allows says why. */
    /**
     * A saved plan's system figures as planned today, for a service that has already decided who
     * may see them (the handover sheet goes to warehouse staff, who do not plan). Null when the
     * plan can no longer be worked out.
     */
    async savedFigures(id: string) {
      const [row] = await db.select({ name: stackPlans.name, request: stackPlans.request }).from(stackPlans).where(eq(stackPlans.id, id));
      const request = row ? StackPlanRequestSchema.safeParse(row.request) : null;
      if (!row || !request?.success) return null;
      const p = await workOut(request.data, 0).catch((e) => (e instanceof ValidationError ? null : Promise.reject(e)));
      return p && { name: row.name, rangeName: p.rangeName, stacks: p.stacks, modulesPerStack: p.modulesPerStack, usableKwh: p.usableKwh, nominalVoltage: p.nominalVoltage, dvc: p.dvc };
    },

    async replanSaved(actor: Actor, id: string) {
      const saved = await this.findPlan(actor, id);
      const request = StackPlanRequestSchema.safeParse(saved.request);
      if (!request.success) throw new ConflictError('This saved plan can no longer be read. Plan it again from the planner.');
      try {
        return { saved, plan: await plan(actor, request.data) };
      } catch (e) {
        if (e instanceof ValidationError) throw new ConflictError(`Its range has changed since this plan was saved: ${e.message} Open it in the planner to adjust it.`);
        throw e;
      }
    },

    async rangeDetail(actor: Actor, idOrCode: string) {
      authorize(actor, 'catalogue.view');
      const r = await loadRange(idOrCode);
      return { ...r, canEdit: can(actor.role, 'ranges.edit') };
    },

    async inverters(actor: Actor) {
      authorize(actor, 'catalogue.view');
      const rows = await db.select({ part: parts, makerName: makers.name }).from(parts).innerJoin(makers, eq(makers.id, parts.makerId)).where(and(eq(parts.category, 'inverter'), sql`${parts.archivedAt} is null`)).orderBy(asc(parts.name));
      const skuById = new Map(rows.map(({ part }) => [part.id, part.sku]));
      return rows.map(({ part, makerName }) => ({
        ...inverterFrom(part),
        makerName,
        lifecycle: part.lifecycle,
        supersededBy: part.supersededById ? (skuById.get(part.supersededById) ?? null) : null,
        listPriceCents: part.listPriceCents,
      }));
    },

    /** Saves a range's definition; a rule naming a part that does not exist cannot be saved. */
    async updateRange(actor: Actor, idOrCode: string, input: RangeInput & { rules: ReturnType<typeof BomRulesSchema.parse> }) {
      authorize(actor, 'ranges.edit');
      const current = await loadRange(idOrCode);
      const skus = [...new Set([input.controllerSku, input.moduleSku, ...input.inverterSkus, ...input.rules.map((r) => r.sku)].map((s) => s.toUpperCase()))];
      const found = await db.select().from(parts).where(inArray(parts.sku, skus));
      const bySku = new Map(found.map((p) => [p.sku, p]));
      const fields: { path: string; message: string }[] = [];
      const expect = (path: string, sku: string, category?: string) => {
        const p = bySku.get(sku.toUpperCase());
        if (!p) fields.push({ path, message: `There is no part ${sku}.` });
        else if (category && p.category !== category) fields.push({ path, message: `${sku} is not a ${category}.` });
      };
      expect('controllerSku', input.controllerSku, 'controller');
      expect('moduleSku', input.moduleSku, 'module');
      input.inverterSkus.forEach((s, i) => expect(`inverterSkus.${i}`, s, 'inverter'));
      const known = Object.fromEntries(found.map((p) => [p.sku, plannerPart(p)]));
      for (const missing of unknownRuleSkus(input.rules, known)) {
        const i = input.rules.findIndex((r) => r.sku === missing);
        fields.push({ path: `rules.${i}.sku`, message: `There is no part ${missing}: a rule must name a catalogue part.` });
      }
      if (fields.length) throw new ValidationError('The range refers to parts that do not fit.', { fields });
      await db.transaction(async (tx) => {
        await tx
          .update(ranges)
          .set({
            name: input.name,
            connection: input.connection,
            controllerId: bySku.get(input.controllerSku.toUpperCase())!.id,
            moduleId: bySku.get(input.moduleSku.toUpperCase())!.id,
            minModules: input.minModules,
            maxModules: input.maxModules,
            maxStacks: input.maxStacks,
            baseHeightMm: input.baseHeightMm,
            defaultDodPct: input.defaultDodPct,
            rules: input.rules,
            updatedAt: new Date(),
          })
          .where(eq(ranges.id, current.row.id));
        await tx.delete(rangeInverters).where(eq(rangeInverters.rangeId, current.row.id));
        if (input.inverterSkus.length) await tx.insert(rangeInverters).values(input.inverterSkus.map((s) => ({ rangeId: current.row.id, inverterId: bySku.get(s.toUpperCase())!.id })));
        // Parts that were in the range (controller, module, rule parts, inverters) and those now in it.
        const oldIds = (await tx.select({ id: parts.id }).from(parts).where(inArray(parts.sku, Object.keys(current.parts)))).map((r) => r.id);
        await onRangeChanged(tx, [...found.map((p) => p.id), ...oldIds, ...current.inverters.map((p) => p.id)]);
      }).finally(rangeCache.clear);
      return this.rangeDetail(actor, current.row.id);
    },
  };
}

export type PlannerService = ReturnType<typeof createPlannerService>;

/** An installer's plan priced at their company's tier (the list price less its discount); staff see list prices. */
function atCustomerPrices<P extends { bom: { packs: number; unitPriceCents: number | null; lineTotalCents: number | null }[]; totals: QuoteTotals }>(plan: P, discountPct: number): P {
  if (discountPct === 0) return plan;
  const bom = plan.bom.map((l) => {
    const unitPriceCents = l.unitPriceCents === null ? null : discountedCents(l.unitPriceCents, discountPct);
    return { ...l, unitPriceCents, lineTotalCents: pricedLineTotal({ packs: l.packs, unitPriceCents }) };
  });
  return { ...plan, bom, totals: quoteTotals(bom, plan.totals.gstMethod) };
}
