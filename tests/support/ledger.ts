import { sql } from 'drizzle-orm';
import type { Db } from '../../server/db/client.ts';

/**
 * Recomputes every level from the ledger and the reservations: on hand must equal the sum of
 * its movements, reserved the sum of its reservations. Returns the rows that disagree.
 */
export async function ledgerDifferences(db: Db) {
  const r = await db.execute(sql`
    select 'on_hand' as what, coalesce(l.part_id, m.part_id)::text as part_id, coalesce(l.bin, m.bin) as bin, l.on_hand as level, m.total as ledger
    from stock_levels l
    full outer join (select part_id, warehouse_id, bin, sum(qty)::int as total from stock_movements group by 1, 2, 3) m
      on m.part_id = l.part_id and m.warehouse_id = l.warehouse_id and m.bin = l.bin
    where coalesce(l.on_hand, 0) <> coalesce(m.total, 0)
    union all
    select 'reserved', l.part_id::text, l.bin, l.reserved, coalesce(r.total, 0)
    from stock_levels l
    left join (select part_id, warehouse_id, bin, sum(qty)::int as total from reservations group by 1, 2, 3) r
      on r.part_id = l.part_id and r.warehouse_id = l.warehouse_id and r.bin = l.bin
    where l.reserved <> coalesce(r.total, 0)
    union all
    select 'orphan reservation', r.part_id::text, r.bin, null, r.qty
    from reservations r left join stock_levels l on l.part_id = r.part_id and l.warehouse_id = r.warehouse_id and l.bin = r.bin
    where l.part_id is null`);
  return r.rows;
}

/** A fingerprint of all stock state, to show a refused request changed nothing. */
export async function stockSnapshot(db: Db) {
  const r = await db.execute(sql`
    select
      (select coalesce(json_agg(l order by l.part_id, l.warehouse_id, l.bin), '[]') from (select part_id, warehouse_id, bin, on_hand, reserved from stock_levels) l) as levels,
      (select count(*)::int from stock_movements) as movements,
      (select coalesce(json_agg(r order by r.job_line_id, r.warehouse_id, r.bin), '[]') from (select job_line_id, warehouse_id, bin, qty from reservations) r) as reservations,
      (select coalesce(json_agg(b order by b.job_line_id), '[]') from (select job_line_id, qty from backorders) b) as backorders,
      (select coalesce(json_agg(j order by j.id), '[]') from (select id, status from jobs) j) as jobs`);
  return r.rows[0];
}
