// Concurrent reservations on scarce parts, on the big data set, beside the plainest write
// PostgreSQL does: a single-row UPDATE per transaction (pgbench-style), same server, same run.
import os from 'node:os';
import { performance } from 'node:perf_hooks';
import { eq, sql } from 'drizzle-orm';
import pg from 'pg';
import type { Db } from '../../server/db/client.ts';
import { createDb } from '../../server/db/client.ts';
import { settings, user } from '../../server/db/schema/index.ts';
import { createJobService } from '../../server/services/jobs.ts';
import { createPlannerService } from '../../server/services/planner.ts';
import type { Actor } from '../../server/policies/actor.ts';
import { reservationPlan, reserveInTx } from '../../server/services/reservations.ts';
import { inStockTransaction } from '../../server/services/ledger.ts';

export const BENCH_JOBS = 10_000;
const MARKER = 'bench.jobs';
const CLIENTS = 16;

/** 10,000 jobs of the installer companies, mostly closed history, two lines each (deterministic). */
export async function generateBenchJobs(db: Db) {
  const [done] = await db.select().from(settings).where(eq(settings.key, MARKER));
  if (done) return false;
  await db.transaction(async (tx) => {
    await tx.execute(sql`
      with c as (select array_agg(id order by name) as ids from companies where kind = 'installer'),
           u as (select id from "user" where email = 'sales@stackyard.test')
      insert into jobs (company_id, reference, status, site_suburb, site_postcode, created_by, lines_copied_at, ordered_at, created_at, updated_at)
      select c.ids[1 + i % array_length(c.ids, 1)], 'BJ-' || lpad(i::text, 6, '0'),
             (array['closed','closed','closed','collected','dispatched','cancelled','draft','closed'])[1 + i % 8],
             'Benchmark', '3000', u.id, now(), now() - (i || ' hours')::interval, now() - (i || ' hours')::interval, now() - (i || ' hours')::interval
      from generate_series(1, ${BENCH_JOBS}) i, c, u`);
    await tx.execute(sql`
      insert into job_lines (job_id, line_no, part_id, qty, reason, unit_price_cents)
      select j.id, k, p.id, 1 + (j.n + k) % 4, 'Added by SKU', p.list_price_cents
      from (select id, row_number() over (order by reference) as n from jobs where reference like 'BJ-%') j
      cross join generate_series(1, 2) k
      join (select id, list_price_cents, row_number() over (order by sku) as m from parts where sku like 'BN-%') p on p.m = 1 + (j.n * 13 + k * 7) % 50000`);
    await tx.execute(sql`insert into job_status_history (job_id, status, at) select id, status, created_at from jobs where reference like 'BJ-%'`);
    await tx.insert(settings).values({ key: MARKER, value: { jobs: BENCH_JOBS } });
  });
  await db.execute(sql`analyze`);
  return true;
}

async function run(concurrency: number, total: number, work: (i: number) => Promise<void>) {
  let next = 0;
  const started = performance.now();
  await Promise.all(
    Array.from({ length: concurrency }, async () => {
      while (next < total) await work(next++);
    }),
  );
  return total / ((performance.now() - started) / 1000);
}

/**
 * Reserves `jobs` ordered jobs, 16 at a time, on 20 parts whose demand exceeds their stock;
 * the reference is single-row UPDATE transactions from 16 clients through `pg`.
 */
export async function benchReservations(url: string, { jobs: jobCount = 400 } = {}) {
  const db = createDb(url, { max: CLIENTS + 2 });
  try {
    const [u] = await db.select().from(user).where(eq(user.email, 'sales@stackyard.test'));
    const sales: Actor = { userId: u!.id, name: u!.name, email: u!.email, role: 'sales', companyId: u!.companyId ?? null };
    const service = createJobService({ db, planner: createPlannerService({ db }) });

    // The 20 benchmark parts with the least stock; the jobs ask for about twice what they hold.
    const scarce = (await db.execute<{ sku: string; on_hand: number }>(sql`
      select p.sku, sum(l.on_hand)::int as on_hand from parts p join stock_levels l on l.part_id = p.id
      where p.sku like 'BN-%' group by p.sku order by sum(l.on_hand), p.sku limit 20`)).rows;
    const stock = scarce.reduce((s, p) => s + p.on_hand, 0);
    const perJobQty = Math.max(1, Math.round((2 * stock) / (jobCount * 2)));
    const [company] = (await db.execute<{ id: string }>(sql`select id from companies where kind = 'installer' order by name limit 1`)).rows;
    const runTag = Date.now().toString(36).toUpperCase();
    let demand = 0;
    /** A batch of ordered jobs, made 16 at a time. */
    const batch = async (tag: string) => {
      const ids: string[] = new Array(jobCount);
      demand = 0;
      await run(CLIENTS, jobCount, async (i) => {
        // Two lines naming the parts in different orders (what would deadlock a careless lock order).
        const a = scarce[i % scarce.length]!.sku;
        const b = scarce[(i * 7 + 3) % scarce.length]!.sku;
        const lines = a === b ? [{ sku: a, qty: 2 * perJobQty }] : [{ sku: a, qty: perJobQty }, { sku: b, qty: perJobQty }];
        demand += lines.reduce((s, l) => s + l.qty, 0);
        const job = await service.create(sales, { companyId: company!.id, reference: `BR-${runTag}-${tag}${i}`, lines, preferredWarehouse: i % 2 ? 'WST' : 'NTH' });
        await service.order(sales, job.job.id);
        ids[i] = job.job.id;
      });
      return ids;
    };
    const ids = await batch('A');

    // Reference: one single-row UPDATE per transaction, 16 clients, random rows of the 200,000.
    const pool = new pg.Pool({ connectionString: url, max: CLIENTS });
    const keys = (await pool.query<{ part_id: string; warehouse_id: string; bin: string }>(`select part_id, warehouse_id, bin from stock_levels tablesample system (1) limit 5000`)).rows;
    let k = 0;
    const update = () => {
      const row = keys[k++ % keys.length]!;
      return pool.query('update stock_levels set updated_at = now() where part_id = $1 and warehouse_id = $2 and bin = $3', [row.part_id, row.warehouse_id, row.bin]).then(() => {});
    };
    await run(CLIENTS, 500, update); // warm-up
    const updatesPerSecond = await run(CLIENTS, 4000, update);
    await pool.end();

    let failures = 0;
    const reservationsPerSecond = await run(CLIENTS, ids.length, (i) =>
      service.reserve(sales, ids[i]!).then(
        () => {},
        () => void failures++,
      ),
    );

    const check = (await db.execute<{ over_rows: number; over_parts: number; reserved: number; backordered: number; on_hand: number }>(sql`
      with p as (select id from parts where sku = any(${`{${scarce.map((s) => s.sku).join(',')}}`}::text[]))
      select (select count(*)::int from stock_levels where reserved > on_hand) as over_rows,
             (select count(*)::int from p where (select coalesce(sum(qty), 0) from reservations r where r.part_id = p.id) > (select coalesce(sum(on_hand), 0) from stock_levels l where l.part_id = p.id)) as over_parts,
             (select coalesce(sum(qty), 0)::int from reservations where part_id in (select id from p)) as reserved,
             (select coalesce(sum(qty), 0)::int from backorders where part_id in (select id from p)) as backordered,
             (select coalesce(sum(on_hand), 0)::int from stock_levels where part_id in (select id from p)) as on_hand`)).rows[0]!;

    // Put the benchmark's units back, so the next run starts from the same stock.
    await run(CLIENTS, ids.length, (i) => service.cancel(sales, ids[i]!).then(() => {}));

    // Where the time goes: the same work as the reservation transaction alone (no HTTP-style
    // checks before it, no read-back of the job after it).
    const second = await batch('B');
    const transactionsPerSecond = await run(CLIENTS, second.length, async (i) => {
      const plan = await reservationPlan(db, second[i]!);
      await inStockTransaction(db, (tx) => reserveInTx(tx, second[i]!, plan, { userId: sales.userId, now: new Date(), quoteHoldMs: 0 })).catch(() => void failures++);
    });
    await run(CLIENTS, second.length, (i) => service.cancel(sales, second[i]!).then(() => {}));

    const ratio = reservationsPerSecond / updatesPerSecond;
    return {
      jobs: ids.length,
      parts: scarce.length,
      unitsOnHand: stock,
      unitsAskedFor: demand,
      reservationsPerSecond: Math.round(reservationsPerSecond),
      singleRowUpdatesPerSecond: Math.round(updatesPerSecond),
      ratio: Math.round(ratio * 1000) / 1000,
      reservationTransactionsPerSecond: Math.round(transactionsPerSecond),
      transactionRatio: Math.round((transactionsPerSecond / updatesPerSecond) * 1000) / 1000,
      oversoldRows: check.over_rows,
      oversoldParts: check.over_parts,
      unitsReserved: check.reserved,
      unitsBackordered: check.backordered,
      failedReservations: failures,
      target: '≥ 40 % of single-row UPDATE transactions/s, 0 oversold, no failed reservation',
      // Other work on the machine moves both figures; the 1-minute load average says how much.
      loadAverage: Math.round(os.loadavg()[0]! * 100) / 100,
      met: ratio >= 0.4 && check.over_rows === 0 && check.over_parts === 0 && failures === 0,
    };
  } finally {
    await db.$client.end();
  }
}
