// Many trade-desk users reserving the same last units at once, each from its own connection.
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { sql } from 'drizzle-orm';
import { createTestApp, type TestApp } from '../support/app.ts';
import { ledgerDifferences } from '../support/ledger.ts';
import { makeCompany, makeStockPart, makeUser, makeWarehouse, putStock } from '../../seed/factories.ts';
import { createDb, type Db } from '../../server/db/client.ts';
import { createJobService } from '../../server/services/jobs.ts';
import { createStockService } from '../../server/services/stock.ts';
import type { Actor } from '../../server/policies/actor.ts';
import { createReservationGroups } from '../../server/services/reservation-groups.ts';
import { reservationPlan } from '../../server/services/reservations.ts';

let t: TestApp;
let sales: Actor;
let warehouseUser: Actor;
const pools: Db[] = [];

beforeAll(async () => {
  t = await createTestApp();
  const s = await makeUser(t.db, t.auth, { role: 'sales' });
  const w = await makeUser(t.db, t.auth, { role: 'warehouse' });
  sales = { userId: s.id, name: s.name, email: s.email, role: 'sales', companyId: s.companyId ?? null };
  warehouseUser = { userId: w.id, name: w.name, email: w.email, role: 'warehouse', companyId: w.companyId ?? null };
});
afterAll(async () => {
  await Promise.all(pools.map((p) => p.$client.end()));
  await t.close();
});
afterEach(async () => expect(await ledgerDifferences(t.db)).toEqual([]));

/** A deterministic sequence, so a failure can be replayed. */
function sequence(seed: number) {
  let x = seed;
  return () => ((x = (x * 1103515245 + 12345) % 2 ** 31) / 2 ** 31);
}

/** One service per connection: each caller really is a separate session to PostgreSQL. */
function separateConnection() {
  const db = createDb(t.dbUrl, { max: 1 });
  pools.push(db);
  return { jobs: createJobService({ db, planner: t.services.planner }), stock: createStockService({ db }) };
}

async function scarceStock() {
  const a = await makeWarehouse(t.db, { code: 'CC-A', rank: 1 });
  const b = await makeWarehouse(t.db, { code: 'CC-B', rank: 2 });
  const p1 = await makeStockPart(t.db);
  const p2 = await makeStockPart(t.db);
  const p3 = await makeStockPart(t.db);
  await putStock(t.db, p1.id, a.id, 'A-01', 3);
  await putStock(t.db, p1.id, a.id, 'A-02', 2);
  await putStock(t.db, p1.id, b.id, 'B-01', 2);
  await putStock(t.db, p2.id, a.id, 'A-03', 5);
  await putStock(t.db, p3.id, b.id, 'B-02', 4);
  return [p1, p2, p3];
}

async function orderedJobs(n: number, skus: string[], random: () => number) {
  const company = await makeCompany(t.db);
  const ids: string[] = [];
  const demand = new Map<string, number>();
  for (let i = 0; i < n; i++) {
    // Lines name the parts in different orders, which is what deadlocks a careless lock order.
    const chosen = [...skus].sort(() => random() - 0.5).slice(0, 1 + Math.floor(random() * skus.length));
    const lines = chosen.map((sku) => ({ sku, qty: 1 + Math.floor(random() * 3) }));
    for (const l of lines) demand.set(l.sku, (demand.get(l.sku) ?? 0) + l.qty);
    const job = await t.services.jobs.create(sales, { companyId: company.id, reference: `RUSH-${i}-${Math.floor(random() * 1e6)}`, lines, preferredWarehouse: random() < 0.5 ? 'CC-A' : 'CC-B' });
    await t.services.jobs.order(sales, job.job.id);
    ids.push(job.job.id);
  }
  return { ids, demand };
}

async function totals(skus: string[]) {
  const r = await t.db.execute<{ sku: string; on_hand: number; reserved: number; backordered: number; over: number }>(sql`
    select p.sku,
      (select coalesce(sum(on_hand), 0)::int from stock_levels where part_id = p.id) as on_hand,
      (select coalesce(sum(qty), 0)::int from reservations where part_id = p.id) as reserved,
      (select coalesce(sum(qty), 0)::int from backorders where part_id = p.id) as backordered,
      (select count(*)::int from stock_levels where part_id = p.id and reserved > on_hand) as over
    from parts p where p.sku = any(${`{${skus.join(',')}}`}::text[])`);
  return new Map(r.rows.map((x) => [x.sku, x]));
}

describe('concurrent reservations on scarce stock', () => {
  it('60 parallel reservations from separate connections hand out exactly the available units, no more, and nobody sees a deadlock', async () => {
    const parts = await scarceStock();
    const skus = parts.map((p) => p.sku);
    const { ids, demand } = await orderedJobs(60, skus, sequence(20261203));
    const callers = ids.map(() => separateConnection());
    const results = await Promise.allSettled(ids.map((id, i) => callers[i]!.jobs.reserve(sales, id)));
    const failures = results.filter((r) => r.status === 'rejected').map((r) => String((r as PromiseRejectedResult).reason));
    expect(failures).toEqual([]);

    const after = await totals(skus);
    for (const sku of skus) {
      const x = after.get(sku)!;
      expect(x.over).toBe(0); // reserved ≤ on hand on every row
      // exactly what was there is handed out (demand exceeds stock for every part here), the rest waits
      expect(demand.get(sku)!).toBeGreaterThan(x.on_hand);
      expect(x.reserved).toBe(x.on_hand);
      expect(x.backordered).toBe(demand.get(sku)! - x.on_hand);
    }
    // every line is either held or waiting, never both lost nor double counted
    const lines = await t.db.execute<{ qty: number; held: number; waiting: number }>(sql`
      select l.qty, coalesce((select sum(qty) from reservations r where r.job_line_id = l.id), 0)::int as held,
             coalesce((select qty from backorders b where b.job_line_id = l.id), 0)::int as waiting
      from job_lines l where l.job_id = any(${`{${ids.join(',')}}`}::uuid[])`);
    for (const l of lines.rows) expect(l.held + l.waiting).toBe(l.qty);
  });

  it('reservations, receipts and cancellations racing each other leave every level explained by the ledger', async () => {
    const parts = await scarceStock();
    const skus = parts.map((p) => p.sku);
    const random = sequence(7);
    const { ids } = await orderedJobs(50, skus, random);
    const work: Promise<unknown>[] = [];
    // The first six are also being cancelled: their reservation may fairly find them cancelled (409).
    ids.forEach((id, i) =>
      work.push(
        separateConnection()
          .jobs.reserve(sales, id)
          .catch((e: { status?: number; message: string }) => {
            if (i < 6 && e.status === 409) return e.message;
            throw e;
          }),
      ),
    );
    for (let i = 0; i < 6; i++) work.push(separateConnection().stock.receive(warehouseUser, { warehouse: i % 2 ? 'CC-A' : 'CC-B', lines: skus.map((sku) => ({ sku, bin: 'R-01', qty: 1 + (i % 3) })) }));
    for (const id of ids.slice(0, 6)) work.push(separateConnection().jobs.cancel(sales, id));
    const results = await Promise.allSettled(work);
    expect(results.filter((r) => r.status === 'rejected').map((r) => String((r as PromiseRejectedResult).reason))).toEqual([]);
    const after = await totals(skus);
    for (const sku of skus) {
      const x = after.get(sku)!;
      expect(x.over).toBe(0);
      // nothing is left free while someone waits for it
      if (x.backordered > 0) expect(x.reserved).toBe(x.on_hand);
    }
    const cancelled = await t.db.execute<{ n: number }>(sql`select count(*)::int as n from reservations r join job_lines l on l.id = r.job_line_id join jobs j on j.id = l.job_id where j.status = 'cancelled'`);
    expect(cancelled.rows[0]!.n).toBe(0);
  });

  it('two trade-desk users reserving the same last three units at once: one gets them, the other is backordered', async () => {
    const wh = await makeWarehouse(t.db, { code: 'CC-A', rank: 1 });
    const p = await makeStockPart(t.db);
    await putStock(t.db, p.id, wh.id, 'L-01', 3);
    const [deskA, deskB] = [await t.signIn('sales'), await t.signIn('sales')];
    const company = await makeCompany(t.db);
    const make = async (agent: typeof deskA, reference: string) => {
      const id = (await agent.post('/api/jobs').send({ companyId: company.id, reference, lines: [{ sku: p.sku, qty: 3 }] }).expect(201)).body.data.id as string;
      await agent.post(`/api/jobs/${id}/order`).expect(200);
      return id;
    };
    const [a, b] = [await make(deskA, 'FRIDAY-455-A'), await make(deskB, 'FRIDAY-455-B')];
    const [ra, rb] = await Promise.all([deskA.post(`/api/jobs/${a}/reserve`), deskB.post(`/api/jobs/${b}/reserve`)]);
    expect([ra.status, rb.status]).toEqual([200, 200]);
    const outcomes = [ra.body.data, rb.body.data].map((j: { status: string; lines: { reserved: number; backordered: number }[] }) => [j.status, j.lines[0]!.reserved, j.lines[0]!.backordered]);
    expect(outcomes).toEqual(expect.arrayContaining([
      ['reserved', 3, 0],
      ['part-reserved', 0, 3],
    ]));
  });

  it('reservations waiting for a commit share the next one; a refused job gets its own 409 and changes nothing, the others are reserved', async () => {
    const parts = await scarceStock();
    const skus = parts.map((p) => p.sku);
    const { ids } = await orderedJobs(8, skus, sequence(42));
    await t.services.jobs.cancel(sales, ids[3]!);
    let transactions = 0;
    const counting = Object.create(t.db) as Db;
    counting.transaction = ((fn: Parameters<Db['transaction']>[0]) => (transactions++, t.db.transaction(fn))) as Db['transaction'];
    const reserve = createReservationGroups(counting);
    const plans = await Promise.all(ids.map((id) => reservationPlan(t.db, id)));
    const opts = { userId: sales.userId, now: new Date(), quoteHoldMs: 0 };
    const results = await Promise.allSettled(ids.map((id, i) => reserve(id, plans[i]!, opts)));

    // The first starts alone; the seven asked for while it commits go together (group commit).
    expect(transactions).toBe(2);
    expect(results.map((r) => r.status)).toEqual(['fulfilled', 'fulfilled', 'fulfilled', 'rejected', 'fulfilled', 'fulfilled', 'fulfilled', 'fulfilled']);
    expect((results[3] as PromiseRejectedResult).reason).toMatchObject({ status: 409, message: expect.stringMatching(/cancelled/) });
    const cancelledHolds = await t.db.execute<{ n: number }>(sql`select count(*)::int as n from reservations r join job_lines l on l.id = r.job_line_id where l.job_id = ${ids[3]}`);
    expect(cancelledHolds.rows[0]!.n).toBe(0);
    const states = await t.db.execute<{ id: string; status: string }>(sql`select id, status from jobs where id = any(${`{${ids.join(',')}}`}::uuid[])`);
    const status = new Map(states.rows.map((r) => [r.id, r.status]));
    ids.forEach((id, i) => expect(status.get(id)).toEqual(i === 3 ? 'cancelled' : expect.stringMatching(/^(reserved|part-reserved)$/)));
    const after = await totals(skus);
    for (const sku of skus) expect(after.get(sku)!.over).toBe(0);
  });
});
