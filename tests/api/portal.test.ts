// The installer's side: home summary, ordering again, plans available now instead of waiting,
// and company isolation on each of them.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { eq, sql } from 'drizzle-orm';
import { createTestApp, type TestApp } from '../support/app.ts';
import { seedCatalogue } from '../../seed/catalogue.ts';
import { makeCompany, makeStockPart, makeWarehouse, putStock } from '../../seed/factories.ts';
import { jobs, ranges } from '../../server/db/schema/index.ts';

type Agent = Awaited<ReturnType<TestApp['signIn']>>;
let t: TestApp;
let cash: Agent;
let trade: Agent;
let other: Agent;
let sales: Agent;
let warehouse: Agent;
let hearth: string;
let wh: { id: string };
let seq = 0;
const ref = () => `PORTAL-${++seq}`;

beforeAll(async () => {
  t = await createTestApp();
  await t.db.transaction((tx) => seedCatalogue(tx));
  [{ id: hearth }] = (await t.db.select({ id: ranges.id }).from(ranges).where(eq(ranges.code, 'QRB-HEARTH'))) as { id: string }[];
  wh = await makeWarehouse(t.db, { code: 'PTL', rank: 0 });
  sales = await t.signIn('sales');
  [cash, trade, other, warehouse] = await Promise.all([
    t.signIn('installer', { companyId: (await makeCompany(t.db, { name: 'Wombat Hill Solar', accountType: 'cash' })).id }),
    t.signIn('installer', { companyId: (await makeCompany(t.db, { name: 'Redgum Trade Electrical', accountType: 'trade' })).id }),
    t.signIn('installer', { companyId: (await makeCompany(t.db, { name: 'Mallee Storage', accountType: 'cash' })).id }),
    t.signIn('warehouse'),
  ]);
}, 60_000);
afterAll(() => t.close());

async function part(stock: number, price = 10_000) {
  const p = await makeStockPart(t.db, { listPriceCents: price });
  if (stock) await putStock(t.db, p.id, wh.id, 'T-1', stock);
  return p;
}

async function job(agent: Agent, lines: { sku: string; qty: number }[]) {
  const res = await agent.post('/api/jobs').send({ reference: ref(), lines, siteSuburb: 'Daylesford', sitePostcode: '3460' });
  expect(res.status, res.text).toBe(201);
  return res.body.data as { id: string; reference: string };
}

describe('the installer’s home summary', () => {
  it('counts their jobs by status and lists what needs them: unpaid card jobs and backorders; never another company’s', async () => {
    const p = await part(40, 20_000);
    const unpaid = await job(cash, [{ sku: p.sku, qty: 2 }]);
    const scarce = await part(1);
    const waiting = await job(trade, [{ sku: scarce.sku, qty: 3 }]);
    await trade.post(`/api/jobs/${waiting.id}/order`).expect(200);
    await sales.post(`/api/jobs/${waiting.id}/reserve`).expect(200);
    const foreign = await job(other, [{ sku: p.sku, qty: 1 }]);

    const mine = await cash.get('/api/portal/summary');
    expect(mine.status, mine.text).toBe(200);
    expect(mine.body.data.byStatus).toEqual([{ status: 'draft', count: 1 }]);
    const card = mine.body.data.attention.find((a: { id: string }) => a.id === unpaid.id);
    // 2 × $200.00 = $400.00 + 10 % GST = $440.00 (worked by hand).
    expect(card).toMatchObject({ reason: 'unpaid', reference: unpaid.reference, amountCents: 44_000 });
    expect(mine.body.data.attention.map((a: { id: string }) => a.id)).not.toContain(foreign.id);

    const theirs = await trade.get('/api/portal/summary');
    expect(theirs.body.data.attention).toEqual([expect.objectContaining({ id: waiting.id, reason: 'backorder', units: 2 })]);
    expect(theirs.body.data.attention.some((a: { reason: string }) => a.reason === 'unpaid')).toBe(false); // trade terms: invoiced, never "unpaid"
  });

  it('asks for a session', async () => {
    expect((await request(t.app).get('/api/portal/summary')).status).toBe(401);
  });
});

describe('ordering a job again', () => {
  it('makes a new draft with the same lines at today’s prices, marked “again”', async () => {
    const p = await part(30, 5_000);
    const first = await job(trade, [{ sku: p.sku, qty: 4 }]);
    await trade.post(`/api/jobs/${first.id}/order`).expect(200);
    const again = await trade.post(`/api/jobs/${first.id}/reorder`);
    expect(again.status, again.text).toBe(201);
    expect(again.body.data).toMatchObject({ status: 'draft', reference: `${first.reference} (again)`, siteSuburb: 'Daylesford' });
    expect(again.body.data.lines.map((l: { sku: string; qty: number; unitPriceCents: number }) => [l.sku, l.qty, l.unitPriceCents])).toEqual([[p.sku, 4, 5_000]]);
    const third = await trade.post(`/api/jobs/${again.body.data.id}/reorder`).expect(201);
    expect(third.body.data.reference).toBe(`${first.reference} (again 2)`);
  });

  it('another company’s job is 404, the warehouse 403, nobody 401; nothing is made', async () => {
    const p = await part(30);
    const mine = await job(trade, [{ sku: p.sku, qty: 1 }]);
    const count = async () => (await t.db.select({ n: sql<number>`count(*)::int` }).from(jobs))[0]!.n;
    const before = await count();
    expect((await other.post(`/api/jobs/${mine.id}/reorder`)).status).toBe(404);
    expect((await warehouse.post(`/api/jobs/${mine.id}/reorder`)).status).toBe(403);
    expect((await request(t.app).post(`/api/jobs/${mine.id}/reorder`)).status).toBe(401);
    expect((await trade.post('/api/jobs/00000000-0000-0000-0000-000000000000/reorder')).status).toBe(404);
    expect(await count()).toBe(before);
  });
});

describe('ordering an empty plan', () => {
  it('is refused with a clear message and nothing is made', async () => {
    const res = await trade.post('/api/jobs').send({ reference: ref(), planIds: [] });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/needs a saved plan or at least one line/);
    expect((await t.db.select().from(jobs).where(eq(jobs.reference, `PORTAL-${seq}`))).length).toBe(0);
  });
});

describe('plans available now instead of waiting', () => {
  it('offers another module count and other ranges, each fully available, with what changes and what it costs', async () => {
    // Leave three Hearth modules free, so a four-module stack is one short.
    const { rows } = await t.db.execute<{ warehouse: string; bin: string; free: number }>(sql`
      select w.code as warehouse, l.bin, (l.on_hand - l.reserved)::int as free from stock_levels l join parts p on p.id = l.part_id join warehouses w on w.id = l.warehouse_id
      where p.sku = 'QRB-HEARTH-M51' and l.on_hand - l.reserved > 0 order by w.rank, l.bin`);
    let keep = 3;
    for (const r of rows) {
      const take = r.free - Math.min(keep, r.free);
      keep -= Math.min(keep, r.free);
      if (take > 0) await warehouse.post('/api/stock/adjustments').send({ sku: 'QRB-HEARTH-M51', warehouse: r.warehouse, bin: r.bin, qty: -take, reason: 'Test: set aside for another site' }).expect(201);
    }

    const asked = { rangeId: hearth, modules: 4 };
    const res = await trade.post('/api/stack-plans/alternatives').send(asked);
    expect(res.status, res.text).toBe(200);
    expect(res.body.data.short).toEqual([expect.objectContaining({ sku: 'QRB-HEARTH-M51', short: 1 })]);
    const alts = res.body.data.alternatives as { kind: string; request: Record<string, unknown>; modulesPerStack: number; usableKwh: number; differenceCents: number; changes: string[] }[];
    const fewer = alts.find((a) => a.kind === 'modules');
    expect(fewer).toMatchObject({ modulesPerStack: 3 });
    expect(fewer!.differenceCents).toBeLessThan(0); // one module fewer costs less
    expect(fewer!.changes[0]).toBe('1 × 3 modules instead of 1 × 4');
    expect(fewer!.changes[1]).toMatch(/kWh usable \([\d.]+ kWh less\)/);
    // Every offer really is available now: the planner itself says so.
    for (const a of alts) {
      const plan = await trade.post('/api/stack-plans').send(a.request).expect(200);
      expect(plan.body.data.bom.filter((l: { short: number }) => l.short > 0), JSON.stringify(a.request)).toEqual([]);
      if (a.kind === 'range') expect(plan.body.data.usableKwh).toBeGreaterThanOrEqual(fewer!.usableKwh);
    }
    // A plan with nothing short needs no alternatives.
    const fine = await trade.post('/api/stack-plans/alternatives').send({ rangeId: hearth, modules: 2 }).expect(200);
    expect(fine.body.data).toEqual({ short: [], alternatives: [] });
  });

  it('400 on a bad request, 403 for the warehouse, 401 for nobody', async () => {
    const bad = await trade.post('/api/stack-plans/alternatives').send({ rangeId: hearth });
    expect(bad.status).toBe(400);
    expect(bad.body.error.code).toBe('validation_failed');
    expect((await warehouse.post('/api/stack-plans/alternatives').send({ rangeId: hearth, modules: 2 })).status).toBe(403);
    expect((await request(t.app).post('/api/stack-plans/alternatives').send({ rangeId: hearth, modules: 2 })).status).toBe(401);
  });
});
