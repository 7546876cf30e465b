// The demo's purchasing side: the two suppliers' terms, what each charges for the parts it
// carries, sell-price rules per category and two customer tiers. Sample price lists for both
// suppliers sit beside this file (price-lists/), made by price-lists/generate.ts.
import Decimal from 'decimal.js';
import { eq, sql } from 'drizzle-orm';
import type { Db, Tx } from '../server/db/client.ts';
import { companies, customerTiers, pricingRules, suppliers } from '../server/db/schema/index.ts';
import { CATEGORY_CODES } from '../shared/contracts/part-attributes.ts';
import { toCostCents } from '../shared/domain/price-list.ts';

export const DEMO_SUPPLIER_TERMS = {
  KESTREL: { currency: 'AUD', audPerUnit: '1', numberLocale: 'en-AU', leadTimeDays: 5, contactName: 'Orders desk', contactEmail: 'orders@kestrel-trade.test', contactPhone: '03 9000 0140', flagChangePct: '10' },
  // A European distributor: prices in euros, numbers written 1.234,50.
  MARRAM: { currency: 'EUR', audPerUnit: '1.65', numberLocale: 'de-DE', leadTimeDays: 21, contactName: 'Export sales', contactEmail: 'export@marram-wholesale.test', contactPhone: null, flagChangePct: '8' },
} as const;

/** Marram's price in AUD is about this much above the part's cost (Kestrel's is the cost itself). */
export const MARRAM_FACTOR = 1.04;

/** Marram's price in euros for a part of this cost: what its price list says. */
export function marramEuros(costCents: number): Decimal {
  return new Decimal(costCents).times(MARRAM_FACTOR).dividedBy(100).dividedBy(DEMO_SUPPLIER_TERMS.MARRAM.audPerUnit).toDecimalPlaces(2, Decimal.ROUND_HALF_UP);
}

const MARKUPS: Partial<Record<(typeof CATEGORY_CODES)[number], number>> = { module: 28, controller: 28, inverter: 22 };

export async function seedPurchasing(db: Db | Tx) {
  for (const [code, terms] of Object.entries(DEMO_SUPPLIER_TERMS)) await db.update(suppliers).set(terms).where(eq(suppliers.code, code));
  // Supplier costs from the demo part costs; pack sizes as the parts are sold; bigger orders of small parts cheaper.
  await db.execute(sql`
    update part_supplier_skus s set
      cost_cents = p.cost_cents,
      pack_size = p.pack_size,
      moq = case when p.category in ('module', 'controller', 'inverter') then 1 else p.pack_size * 5 end,
      price_breaks = case when p.category in ('module', 'controller', 'inverter') or sup.code = 'MARRAM' then '[]'::jsonb
        else jsonb_build_array(jsonb_build_object('minQty', p.pack_size * 50, 'costCents', round(p.cost_cents * 0.92))) end,
      description = p.name
    from parts p, suppliers sup where p.id = s.part_id and sup.id = s.supplier_id`);
  // Marram invoices in euros: its AUD cost is what the import makes of its euro price.
  const { rows: marram } = await db.execute<{ part_id: string; supplier_id: string; cost_cents: string }>(sql`
    select s.part_id, s.supplier_id, p.cost_cents from part_supplier_skus s join parts p on p.id = s.part_id join suppliers sup on sup.id = s.supplier_id
    where sup.code = 'MARRAM' and p.cost_cents is not null`);
  for (const r of marram) {
    const cost = toCostCents(marramEuros(Number(r.cost_cents)), DEMO_SUPPLIER_TERMS.MARRAM.audPerUnit);
    await db.execute(sql`update part_supplier_skus set cost_cents = ${cost} where part_id = ${r.part_id} and supplier_id = ${r.supplier_id}`);
  }
  await db.execute(sql`
    insert into supplier_part_prices (part_id, supplier_id, cost_cents, price_breaks, created_at)
    select part_id, supplier_id, cost_cents, price_breaks, now() - interval '90 days' from part_supplier_skus where cost_cents is not null`);
  for (const category of CATEGORY_CODES) {
    await db.insert(pricingRules).values({ category, basis: 'markup', markupPct: String(MARKUPS[category] ?? 45) }).onConflictDoNothing();
  }
  const tiers = [
    { code: 'TRADE', name: 'Trade', discountPct: '5' },
    { code: 'TRADE-PLUS', name: 'Trade plus', discountPct: '8' },
  ];
  for (const t of tiers) await db.insert(customerTiers).values(t).onConflictDoNothing();
  // Accounts take the tier matching the discount they had.
  await db.execute(sql`update ${companies} c set tier_id = t.id from ${customerTiers} t where c.kind = 'installer' and c.tier_discount_pct = t.discount_pct`);
}
