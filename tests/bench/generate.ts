// Deterministic large catalogue for the benchmarks: 50,000 parts, 200,000 stock rows and
// 1,000,000 ledger rows, generated inside PostgreSQL (same output every run).
import { sql } from 'drizzle-orm';
import type { Db } from '../../server/db/client.ts';
import { settings } from '../../server/db/schema/index.ts';
import { eq } from 'drizzle-orm';

export const BENCH_PARTS = 50_000;
const MARKER = 'bench.generated';

export async function generateBenchCatalogue(db: Db) {
  const [done] = await db.select().from(settings).where(eq(settings.key, MARKER));
  if (done) return false;
  await db.transaction(async (tx) => {
    await tx.execute(sql`
      with m as (select array_agg(id order by code) as ids from makers),
      cats as (select array['cable-set','wall-bracket','accessory','earth-lead','feet','end-cap','cable-cover','comms-terminator'] as c)
      insert into parts (sku, name, category, maker_id, description, gtin, pack_size, mass_kg, attributes, cost_cents, list_price_cents)
      select
        'BN-' || lpad(i::text, 6, '0'),
        (array['Heavy-duty','Slimline','Galvanised','Marine-grade','Compact','Insulated','Weatherproof','Low-profile','Flexible','Armoured'])[1 + i % 10]
          || ' ' || (array['cable set','wall bracket','mounting kit','earth lead','adjustable foot','end cap','cable cover','terminator'])[1 + (i / 10) % 8]
          || ' ' || (10 + i % 190) || (array[' mm',' m',' A',' mm²'])[1 + i % 4],
        cats.c[1 + (i / 10) % 8],
        m.ids[1 + i % array_length(m.ids, 1)],
        'Generated benchmark part number ' || i,
        null,
        1 + (i % 4),
        round((0.1 + (i % 50) / 10.0)::numeric, 3),
        jsonb_build_object('category', cats.c[1 + (i / 10) % 8]) || (case cats.c[1 + (i / 10) % 8]
          when 'cable-set' then jsonb_build_object('lengthM', 0.5 + (i % 20) / 2.0, 'crossSectionMm2', 25)
          when 'wall-bracket' then jsonb_build_object('fixing', 'universal')
          when 'feet' then jsonb_build_object('unitsPerSet', 4, 'heightMm', 60)
          when 'comms-terminator' then jsonb_build_object('protocol', 'CAN')
          else '{}'::jsonb end),
        100 + (i % 9000),
        200 + (i % 15000)
      from generate_series(1, ${BENCH_PARTS}) as i, m, cats`);
    // Five receipts per part × warehouse × bin, then levels equal to their sums.
    await tx.execute(sql`
      insert into stock_movements (part_id, warehouse_id, bin, qty, kind, reason)
      select p.id, w.id, 'B-' || b, 1 + ((p.n * 7 + w.rank * 13 + b * 3 + k * 11) % 20), 'receive', 'Generated receipt'
      from (select id, row_number() over (order by sku) as n from parts where sku like 'BN-%') p
      cross join warehouses w cross join generate_series(1, 2) b cross join generate_series(1, 5) k`);
    await tx.execute(sql`
      insert into stock_levels (part_id, warehouse_id, bin, on_hand, reserved)
      select part_id, warehouse_id, bin, sum(qty)::int, 0 from stock_movements
      where reason = 'Generated receipt' group by part_id, warehouse_id, bin`);
    await tx.insert(settings).values({ key: MARKER, value: { parts: BENCH_PARTS } });
  });
  await db.execute(sql`analyze`);
  return true;
}
