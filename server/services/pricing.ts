import { and, asc, desc, eq, inArray, sql } from 'drizzle-orm';
import type { Db, DbOrTx, Tx } from '../db/client.ts';
import { pgCode } from '../db/errors.ts';
import { companies, customerTiers, partPricing, parts, priceMoves, priceRecomputes, pricingRules, user } from '../db/schema/index.ts';
import { authorize, type Actor } from '../policies/actor.ts';
import { assertCanSeeCompany, companyScopeOf } from '../policies/company-scope.ts';
import { ConflictError, NotFoundError, ValidationError } from '../errors.ts';
import { discountedCents, listPriceFrom } from '@shared/domain/pricing.ts';
import type { PriceBasis } from '@shared/contracts/purchasing.ts';
import type { PartsIndex } from '../search/parts-index.ts';

export interface PricingDeps {
  db: Db;
  partsIndex: PartsIndex;
}

export interface SellPrice {
  partId: string;
  listCents: number | null;
  discountPct: number;
  /** What this customer pays per unit ex GST; null when the part has no list price. */
  sellCents: number | null;
}

/**
 * The customer's discount: their tier's when they have one, else the discount on the account.
 * Exported so the planner and jobs can price a BOM for a customer without the whole service.
 */
export async function customerDiscountPct(db: DbOrTx, companyId: string | null): Promise<number> {
  if (!companyId) return 0;
  const [row] = await db
    .select({ own: companies.tierDiscountPct, tier: customerTiers.discountPct })
    .from(companies)
    .leftJoin(customerTiers, eq(customerTiers.id, companies.tierId))
    .where(eq(companies.id, companyId));
  return Number(row?.tier ?? row?.own ?? 0);
}

/** A customer's unit sell price ex GST for a part, given their discount (null when the part has no list price). */
export function unitPriceFor(part: { listPriceCents: number | null }, discountPct: number): number | null {
  return part.listPriceCents === null ? null : discountedCents(part.listPriceCents, discountPct);
}

/**
 * Sell prices for a customer, ex GST, per part id: the list price less the customer's discount.
 * Never cost. The one function the planner, jobs and the portal call for a customer's prices.
 */
export async function sellPriceFor(db: DbOrTx, partIds: string[], companyId: string | null): Promise<Map<string, SellPrice>> {
  const out = new Map<string, SellPrice>();
  if (partIds.length === 0) return out;
  const [discountPct, rows] = await Promise.all([customerDiscountPct(db, companyId), db.select({ id: parts.id, list: parts.listPriceCents }).from(parts).where(inArray(parts.id, [...new Set(partIds)]))]);
  for (const r of rows) out.set(r.id, { partId: r.id, listCents: r.list, discountPct, sellCents: r.list === null ? null : discountedCents(r.list, discountPct) });
  return out;
}

/**
 * Recomputes list prices from the pricing rules for the given parts (all when omitted), inside the
 * caller's transaction, and records what moved. Parts with neither a category rule nor their own
 * pricing keep the list price someone typed.
 */
export async function recomputeSellPrices(tx: Tx, partsIndex: PartsIndex, opts: { partIds?: string[]; reason: string; importId?: string | null; userId?: string | null }) {
  const { rows } = await tx.execute<{ id: string; list_price_cents: string | null; cost_cents: string | null; basis: PriceBasis; markup_pct: string | null; supplier_list: string | null }>(sql`
    select p.id, p.list_price_cents, p.cost_cents,
           coalesce(pp.basis, r.basis) as basis,
           coalesce(pp.markup_pct, r.markup_pct) as markup_pct,
           (select s.list_price_cents from part_supplier_skus s where s.part_id = p.id and s.list_price_cents is not null
             order by s.cost_cents nulls last, s.supplier_sku limit 1) as supplier_list
    from parts p
    left join part_pricing pp on pp.part_id = p.id
    left join pricing_rules r on r.category = p.category
    where (pp.part_id is not null or r.category is not null)
      ${opts.partIds ? sql`and p.id = any(${`{${opts.partIds.join(',')}}`}::uuid[])` : sql``}
    for no key update of p`);
  const moves: { partId: string; oldCents: number | null; newCents: number }[] = [];
  for (const r of rows) {
    const next = listPriceFrom({ basis: r.basis, markupPct: r.markup_pct ?? 0, costCents: r.cost_cents === null ? null : Number(r.cost_cents), supplierListCents: r.supplier_list === null ? null : Number(r.supplier_list) });
    const old = r.list_price_cents === null ? null : Number(r.list_price_cents);
    if (next !== null && next !== old) moves.push({ partId: r.id, oldCents: old, newCents: next });
  }
  const [run] = await tx.insert(priceRecomputes).values({ reason: opts.reason, importId: opts.importId ?? null, userId: opts.userId ?? null, moved: moves.length }).returning({ id: priceRecomputes.id });
  for (let i = 0; i < moves.length; i += 5000) {
    const chunk = moves.slice(i, i + 5000);
    const ids = `{${chunk.map((m) => m.partId).join(',')}}`;
    const cents = `{${chunk.map((m) => m.newCents).join(',')}}`;
    await tx.execute(sql`update parts set list_price_cents = v.cents, updated_at = now() from unnest(${ids}::uuid[], ${cents}::bigint[]) as v(id, cents) where parts.id = v.id`);
    await tx.insert(priceMoves).values(chunk.map((m) => ({ recomputeId: run!.id, ...m })));
  }
  if (moves.length) await partsIndex.sync(tx, moves.map((m) => m.partId));
  return { id: run!.id, moved: moves.length };
}

export function createPricingService({ db, partsIndex }: PricingDeps) {
  return {
    sellPriceFor: (partIds: string[], companyId: string | null) => sellPriceFor(db, partIds, companyId),

    /** A customer's prices for some SKUs: installers for their own company only; staff name one (or get list prices). */
    async sellPrices(actor: Actor, skus: string[], companyId: string | null) {
      authorize(actor, 'catalogue.view');
      const scope = companyScopeOf(actor);
      const company = scope ?? companyId;
      if (company && company !== scope) {
        const [c] = await db.select({ id: companies.id }).from(companies).where(eq(companies.id, company));
        if (!c) throw new NotFoundError('That customer');
        assertCanSeeCompany(actor, c.id, 'That customer');
      }
      const found = await db.select({ id: parts.id, sku: parts.sku, name: parts.name }).from(parts).where(inArray(parts.sku, skus.map((s) => s.toUpperCase())));
      const prices = await sellPriceFor(db, found.map((f) => f.id), company);
      return found.map((f) => ({ sku: f.sku, name: f.name, ...prices.get(f.id)! }));
    },

    async rules(actor: Actor) {
      authorize(actor, 'purchasing.manage');
      return db.select().from(pricingRules).orderBy(asc(pricingRules.category));
    },

    async setRules(actor: Actor, rules: { category: string; basis: PriceBasis; markupPct: number }[]) {
      authorize(actor, 'purchasing.manage');
      return db.transaction(async (tx) => {
        for (const r of rules) {
          await tx
            .insert(pricingRules)
            .values({ category: r.category, basis: r.basis, markupPct: String(r.markupPct) })
            .onConflictDoUpdate({ target: pricingRules.category, set: { basis: r.basis, markupPct: String(r.markupPct), updatedAt: new Date() } });
        }
        return recomputeSellPrices(tx, partsIndex, { reason: `Pricing rules changed (${rules.map((r) => r.category).join(', ')})`, userId: actor.userId });
      });
    },

    async setPartPricing(actor: Actor, sku: string, input: { basis: PriceBasis | null; markupPct?: number | null }) {
      authorize(actor, 'purchasing.manage');
      const [part] = await db.select({ id: parts.id }).from(parts).where(eq(parts.sku, sku.toUpperCase()));
      if (!part) throw new NotFoundError(`Part ${sku}`);
      if (input.basis === 'markup' && (input.markupPct === null || input.markupPct === undefined)) throw new ValidationError('Give the markup for this part.', { fields: [{ path: 'markupPct', message: 'Give a markup in percent.' }] });
      return db.transaction(async (tx) => {
        if (input.basis === null) await tx.delete(partPricing).where(eq(partPricing.partId, part.id));
        else {
          const values = { basis: input.basis, markupPct: input.markupPct === null || input.markupPct === undefined ? null : String(input.markupPct), updatedAt: new Date() };
          await tx.insert(partPricing).values({ partId: part.id, ...values }).onConflictDoUpdate({ target: partPricing.partId, set: values });
        }
        return recomputeSellPrices(tx, partsIndex, { partIds: [part.id], reason: `Pricing of ${sku.toUpperCase()} changed`, userId: actor.userId });
      });
    },

    async partPricing(actor: Actor) {
      authorize(actor, 'purchasing.manage');
      return db
        .select({ sku: parts.sku, name: parts.name, category: parts.category, basis: partPricing.basis, markupPct: partPricing.markupPct, costCents: parts.costCents, listPriceCents: parts.listPriceCents })
        .from(partPricing)
        .innerJoin(parts, eq(parts.id, partPricing.partId))
        .orderBy(asc(parts.sku));
    },

    async recompute(actor: Actor) {
      authorize(actor, 'purchasing.manage');
      return db.transaction((tx) => recomputeSellPrices(tx, partsIndex, { reason: 'Recomputed by hand', userId: actor.userId }));
    },

    /** The latest recomputes, newest first, each with the prices it moved. */
    async recomputes(actor: Actor, limit = 10) {
      authorize(actor, 'purchasing.manage');
      const runs = await db
        .select({ id: priceRecomputes.id, at: priceRecomputes.createdAt, reason: priceRecomputes.reason, moved: priceRecomputes.moved, by: user.name })
        .from(priceRecomputes)
        .leftJoin(user, eq(user.id, priceRecomputes.userId))
        .orderBy(desc(priceRecomputes.createdAt))
        .limit(limit);
      const moves = runs.length
        ? await db
            .select({ recomputeId: priceMoves.recomputeId, sku: parts.sku, name: parts.name, oldCents: priceMoves.oldCents, newCents: priceMoves.newCents })
            .from(priceMoves)
            .innerJoin(parts, eq(parts.id, priceMoves.partId))
            .where(inArray(priceMoves.recomputeId, runs.map((r) => r.id)))
            .orderBy(asc(parts.sku))
        : [];
      return runs.map((r) => ({ ...r, moves: moves.filter((m) => m.recomputeId === r.id) }));
    },

    async moves(actor: Actor, recomputeId: string) {
      authorize(actor, 'purchasing.manage');
      const [run] = await db.select().from(priceRecomputes).where(eq(priceRecomputes.id, recomputeId));
      if (!run) throw new NotFoundError('That price recompute');
      return db
        .select({ sku: parts.sku, name: parts.name, oldCents: priceMoves.oldCents, newCents: priceMoves.newCents })
        .from(priceMoves)
        .innerJoin(parts, eq(parts.id, priceMoves.partId))
        .where(eq(priceMoves.recomputeId, recomputeId))
        .orderBy(asc(parts.sku));
    },

    async tiers(actor: Actor) {
      authorize(actor, 'purchasing.manage');
      const [tiers, members] = await Promise.all([
        db.select().from(customerTiers).orderBy(asc(customerTiers.discountPct), asc(customerTiers.code)),
        db.select({ id: companies.id, name: companies.name, tierId: companies.tierId }).from(companies).where(and(eq(companies.kind, 'installer'))).orderBy(asc(companies.name)),
      ]);
      return { tiers: tiers.map((t) => ({ ...t, discountPct: Number(t.discountPct), companies: members.filter((m) => m.tierId === t.id).map((m) => ({ id: m.id, name: m.name })) })), customers: members };
    },

    async saveTier(actor: Actor, id: string | null, input: { code: string; name: string; discountPct: number }) {
      authorize(actor, 'purchasing.manage');
      const values = { ...input, discountPct: String(input.discountPct) };
      try {
        if (id) {
          const [row] = await db.update(customerTiers).set(values).where(eq(customerTiers.id, id)).returning();
          if (!row) throw new NotFoundError('That tier');
          return row;
        }
        const [row] = await db.insert(customerTiers).values(values).returning();
        return row!;
      } catch (e) {
        if (pgCode(e) === '23505') throw new ConflictError(`There is already a tier ${input.code}.`, { fields: [{ path: 'code', message: 'Already used.' }] });
        throw e;
      }
    },

    async setCompanyTier(actor: Actor, companyId: string, tierId: string | null) {
      authorize(actor, 'purchasing.manage');
      const [c] = await db.select({ id: companies.id, kind: companies.kind }).from(companies).where(eq(companies.id, companyId));
      if (!c || c.kind !== 'installer') throw new NotFoundError('That customer');
      if (tierId) {
        const [t] = await db.select({ id: customerTiers.id }).from(customerTiers).where(eq(customerTiers.id, tierId));
        if (!t) throw new ValidationError('There is no such tier.', { fields: [{ path: 'tierId', message: 'Unknown tier.' }] });
      }
      await db.update(companies).set({ tierId }).where(eq(companies.id, companyId));
      return { id: companyId, tierId, discountPct: await customerDiscountPct(db, companyId) };
    },
  };
}

export type PricingService = ReturnType<typeof createPricingService>;
