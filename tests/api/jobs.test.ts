import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { sql } from 'drizzle-orm';
import { createTestApp, type TestApp } from '../support/app.ts';
import { ledgerDifferences, stockSnapshot } from '../support/ledger.ts';
import { makeCompany, makePart, makeRange, makeStockPart, makeWarehouse, putStock } from '../../seed/factories.ts';
import { startScheduler, QUOTE_EXPIRY_QUEUE } from '../../server/jobs/quote-expiry.ts';

type Agent = Awaited<ReturnType<TestApp['signIn']>>;
let t: TestApp;
let clock = new Date('2026-12-01T09:00:00Z');
let installer: Agent;
let installer2: Agent;
let sales: Agent;
let warehouse: Agent;
let main: { id: string };
let north: { id: string };
let rangeId: string;
/** What a plan of that range holds: controller, modules, feet and end cap. */
let rangeSkus: string[];
let seq = 0;
const ref = (p = 'JOB') => `${p}-${++seq}`;

beforeAll(async () => {
  t = await createTestApp({ now: () => clock });
  // A range whose plans carry more than the controller and modules: feet and an end cap per stack.
  ({ rangeId, rangeSkus } = await t.db.transaction(async (tx) => {
    const [controller, module, feet, cap] = [await makePart(tx, { category: 'controller' }), await makePart(tx, { category: 'module' }), await makePart(tx, { category: 'feet', packSize: 4, unit: 'pack' }), await makePart(tx, { category: 'end-cap' })];
    const range = await makeRange(tx, { controllerSku: controller.sku, moduleSku: module.sku, rules: [{ sku: feet.sku, basis: 'per-stack', qty: 4 }, { sku: cap.sku, basis: 'per-stack', qty: 1 }] });
    return { rangeId: range.id, rangeSkus: [controller.sku, module.sku, feet.sku, cap.sku] };
  }));
  main = await makeWarehouse(t.db, { code: 'JMAIN', rank: 0 });
  north = await makeWarehouse(t.db, { code: 'JNTH', rank: 5 });
  const [c1, c2] = await Promise.all([makeCompany(t.db), makeCompany(t.db)]);
  // one at a time: the first staff sign-in makes the wholesaler company
  sales = await t.signIn('sales');
  [installer, installer2, warehouse] = await Promise.all([t.signIn('installer', { companyId: c1.id }), t.signIn('installer', { companyId: c2.id }), t.signIn('warehouse')]);
});
afterAll(() => t.close());
afterEach(async () => expect(await ledgerDifferences(t.db)).toEqual([]));

/** A part with stock placed as given: [warehouse, bin, qty][]. */
async function stocked(places: [{ id: string }, string, number][], price: number | null = 1000) {
  const p = await makeStockPart(t.db, { listPriceCents: price });
  for (const [wh, bin, qty] of places) await putStock(t.db, p.id, wh.id, bin, qty);
  return p;
}

async function orderedJob(agent: Agent, lines: { sku: string; qty: number }[], extra: Record<string, unknown> = {}) {
  const created = await agent.post('/api/jobs').send({ reference: ref(), lines, ...extra });
  expect(created.status, created.text).toBe(201);
  const ordered = await agent.post(`/api/jobs/${created.body.data.id}/order`);
  expect(ordered.status, ordered.text).toBe(200);
  return ordered.body.data as { id: string; status: string };
}

describe('the API document', () => {
  it('lists the job and stock routes with their contracts', async () => {
    const res = await request(t.app).get('/api/openapi.json').expect(200);
    expect(Object.keys(res.body.paths)).toEqual(expect.arrayContaining(['/api/jobs', '/api/jobs/{id}', '/api/jobs/{id}/order', '/api/jobs/{id}/reserve', '/api/jobs/{id}/release', '/api/jobs/{id}/cancel', '/api/stock', '/api/stock/movements', '/api/stock/adjustments', '/api/stock/transfers', '/api/stock/receipts', '/api/warehouses']));
    expect(res.body.paths['/api/jobs'].post.requestBody).toBeTruthy();
    expect(res.body.paths['/api/stock/receipts'].post.responses['201']).toBeTruthy();
  });
});

describe('creating jobs', () => {
  it('asks for a session; purchasing and warehouse cannot create jobs', async () => {
    expect((await request(t.app).get('/api/jobs')).status).toBe(401);
    expect((await request(t.app).post('/api/jobs').send({ reference: 'X' })).status).toBe(401);
    const p = await stocked([[main, 'A-1', 5]]);
    expect((await warehouse.post('/api/jobs').send({ reference: ref(), lines: [{ sku: p.sku, qty: 1 }] })).status).toBe(403);
    expect((await (await t.signIn('purchasing')).post('/api/jobs').send({ reference: ref(), lines: [{ sku: p.sku, qty: 1 }] })).status).toBe(403);
  });

  it('installers order a saved plan for their own company; the plan’s BOM lines are copied in with the plan', async () => {
    const saved = await installer.post('/api/stack-plans/saved').send({ name: 'Garage, 9 Banksia Rd', request: { rangeId, modules: 3 } });
    expect(saved.status).toBe(201);
    const extra = await stocked([[main, 'A-2', 10]]);
    const other = await makeCompany(t.db);
    const created = await installer.post('/api/jobs').send({ companyId: other.id, reference: 'BANKSIA-9', siteSuburb: 'Thornbury', sitePostcode: '3071', planIds: [saved.body.data.id], lines: [{ sku: extra.sku, qty: 2 }] });
    expect(created.status, created.text).toBe(201);
    const job = created.body.data;
    expect(job.company.id).toBe(installer.companyId); // their own, whatever they asked
    expect(job.status).toBe('draft');
    expect(job.lines).toHaveLength(1); // plan lines arrive at ordering
    const ordered = (await installer.post(`/api/jobs/${job.id}/order`).expect(200)).body.data;
    expect(ordered.status).toBe('ordered');
    const plan = (await installer.get(`/api/stack-plans/saved/${saved.body.data.id}`)).body.data.plan;
    const fromPlan = ordered.lines.filter((l: { plan: { id: string } | null }) => l.plan?.id === saved.body.data.id);
    expect(fromPlan.map((l: { sku: string; qty: number }) => [l.sku, l.qty])).toEqual(plan.bom.map((l: { sku: string; qtyUnits: number }) => [l.sku, l.qtyUnits]));
    expect(fromPlan.map((l: { sku: string }) => l.sku).sort()).toEqual([...rangeSkus].sort());
    expect(ordered.plans).toMatchObject([{ id: saved.body.data.id, name: 'Garage, 9 Banksia Rd' }]);
    expect(ordered.history.map((h: { status: string; by: string }) => [h.status, h.by])).toEqual([
      ['draft', 'Test installer'],
      ['ordered', 'Test installer'],
    ]);
    // never on-hand figures for an installer
    expect(JSON.stringify(ordered)).not.toMatch(/onHand/);
    expect((await installer.post(`/api/jobs/${job.id}/order`)).status).toBe(409);
  });

  it('sales create jobs for a customer account they name; none named is 400', async () => {
    const p = await stocked([[main, 'A-3', 5]]);
    const customer = await makeCompany(t.db);
    expect((await sales.post('/api/jobs').send({ reference: ref(), lines: [{ sku: p.sku, qty: 1 }] })).status).toBe(400);
    const res = await sales.post('/api/jobs').send({ companyId: customer.id, reference: ref(), lines: [{ sku: p.sku, qty: 1 }] });
    expect(res.status).toBe(201);
    expect(res.body.data.company).toEqual({ id: customer.id, name: customer.name });
  });

  it('refuses bad input with 400, a duplicate reference with 409, and changes nothing', async () => {
    const p = await stocked([[main, 'A-4', 5]]);
    await installer.post('/api/jobs').send({ reference: 'DUP-1', lines: [{ sku: p.sku, qty: 1 }] }).expect(201);
    const before = await stockSnapshot(t.db);
    for (const qty of [0, -1, 1.5, '2']) {
      const res = await installer.post('/api/jobs').send({ reference: ref(), lines: [{ sku: p.sku, qty }] });
      expect(res.status, String(qty)).toBe(400);
      expect(res.body.error.code).toBe('validation_failed');
    }
    const unknown = await installer.post('/api/jobs').send({ reference: ref(), lines: [{ sku: 'NOPE-404', qty: 1 }] });
    expect(unknown.status).toBe(400);
    expect(unknown.body.error.message).toContain('NOPE-404');
    const wh = await installer.post('/api/jobs').send({ reference: ref(), preferredWarehouse: 'NOWHERE', lines: [{ sku: p.sku, qty: 1 }] });
    expect(wh.status).toBe(400);
    expect(wh.body.error.message).toContain('NOWHERE');
    const dup = await installer.post('/api/jobs').send({ reference: 'DUP-1', lines: [{ sku: p.sku, qty: 1 }] });
    expect(dup.status).toBe(409);
    expect(dup.body.error.message).toContain('DUP-1');
    expect(await stockSnapshot(t.db)).toEqual(before);
    // the same reference is fine for another company
    await installer2.post('/api/jobs').send({ reference: 'DUP-1', lines: [{ sku: p.sku, qty: 1 }] }).expect(201);
  });
});

describe('company isolation', () => {
  it('installer2 cannot list, see, order or reserve installer’s job (404)', async () => {
    const p = await stocked([[main, 'A-5', 5]]);
    const job = (await installer.post('/api/jobs').send({ reference: 'MINE-1', lines: [{ sku: p.sku, qty: 1 }] }).expect(201)).body.data;
    const list = await installer2.get('/api/jobs?q=MINE-1');
    expect(list.body.data).toEqual([]);
    expect(list.body.total).toBe(0);
    // asking for another company's jobs by id gives their own, not the other's
    expect((await installer2.get(`/api/jobs?companyId=${installer.companyId}`)).body.data.map((j: { id: string }) => j.id)).not.toContain(job.id);
    expect((await installer2.get(`/api/jobs/${job.id}`)).status).toBe(404);
    expect((await installer2.post(`/api/jobs/${job.id}/order`)).status).toBe(404);
    expect((await installer.get(`/api/jobs?q=MINE-1`)).body.data.map((j: { id: string }) => j.id)).toEqual([job.id]);
    // installers may not reserve at all; staff see every company
    expect((await installer.post(`/api/jobs/${job.id}/reserve`)).status).toBe(403);
    expect((await installer2.post(`/api/jobs/${job.id}/cancel`)).status).toBe(403);
    expect((await sales.get(`/api/jobs/${job.id}`)).status).toBe(200);
    expect((await warehouse.get(`/api/jobs/${job.id}`)).status).toBe(200);
    expect((await sales.get('/api/jobs/not-a-uuid')).status).toBe(404);
  });

  it('installer2 cannot attach installer’s saved plan to a job', async () => {
    const saved = (await installer.post('/api/stack-plans/saved').send({ name: 'Theirs', request: { rangeId, modules: 2 } }).expect(201)).body.data;
    expect((await installer2.post('/api/jobs').send({ reference: ref(), planIds: [saved.id] })).status).toBe(404);
  });

  it('lists with filters: status, company, reference search, paging', async () => {
    const p = await stocked([[main, 'A-6', 5]]);
    const c = await makeCompany(t.db);
    for (const r of ['FILTER-A', 'FILTER-B', 'OTHER-C']) await sales.post('/api/jobs').send({ companyId: c.id, reference: r, lines: [{ sku: p.sku, qty: 1 }] }).expect(201);
    const res = await sales.get(`/api/jobs?companyId=${c.id}&q=filter&status=draft&pageSize=1&page=2`);
    expect(res.body.total).toBe(2);
    expect(res.body.data).toHaveLength(1);
    expect(res.body.data[0]).toMatchObject({ status: 'draft', company: { id: c.id }, lines: 1, units: 1 });
    expect((await sales.get('/api/jobs?status=nonsense')).status).toBe(400);
  });

  it('exports the list as CSV with spreadsheet formulas neutralised', async () => {
    const p = await stocked([[main, 'A-7', 5]]);
    await installer.post('/api/jobs').send({ reference: '=HYPERLINK("http://x.test")', lines: [{ sku: p.sku, qty: 1 }] }).expect(201);
    const res = await installer.get('/api/jobs.csv?q=HYPERLINK');
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/text\/csv/);
    // OWASP "CSV Injection": a leading apostrophe stops the spreadsheet running it
    expect(res.text).toContain(`"'=HYPERLINK(""http://x.test"")"`);
    expect((await installer2.get('/api/jobs.csv?q=HYPERLINK')).text).not.toContain('HYPERLINK');
  });
});

describe('reserving', () => {
  it('moves units held in another warehouse to the job’s own, still reserved for it, with a transfer out and in', async () => {
    const p = await stocked([
      [north, 'N-2', 1],
      [main, 'M-2', 4],
    ]);
    const job = await orderedJob(sales, [{ sku: p.sku, qty: 3 }], { companyId: installer.companyId, preferredWarehouse: 'JNTH' });
    const reserved = (await sales.post(`/api/jobs/${job.id}/reserve`).expect(200)).body.data;
    expect(reserved.abilities.gather).toBe(false); // sales reserve; the warehouse moves stock
    expect((await warehouse.get(`/api/jobs/${job.id}`).expect(200)).body.data.abilities.gather).toBe(true);
    // Sales and installers may not move stock; the warehouse may.
    expect((await sales.post(`/api/jobs/${job.id}/gather`)).status).toBe(403);
    expect((await installer.post(`/api/jobs/${job.id}/gather`)).status).toBe(403);
    const res = await warehouse.post(`/api/jobs/${job.id}/gather`);
    expect(res.status, res.text).toBe(200);
    // 1 was already in JNTH's N-2 (its fullest bin there); the 2 from JMAIN follow them into it.
    expect(res.body.data.reservations).toEqual([{ sku: p.sku, warehouse: 'JNTH', bin: 'N-2', qty: 3, needsTransfer: false, expiresAt: null }]);
    expect(res.body.data.abilities.gather).toBe(false);
    expect(res.body.data.status).toBe('reserved');
    const levels = (await sales.get(`/api/stock?sku=${p.sku}`)).body.data as { warehouse: string; onHand: number; reserved: number }[];
    expect(levels.map((l) => [l.warehouse, l.onHand, l.reserved]).sort()).toEqual([
      ['JMAIN', 2, 0],
      ['JNTH', 3, 3],
    ]);
    const moves = (await sales.get(`/api/stock/movements?sku=${p.sku}&kind=transfer-out`)).body.data as { qty: number; reference: string }[];
    expect(moves).toMatchObject([{ qty: -2 }]);
    // Nothing left to move: a clear 409 and nothing changes.
    const before = await stockSnapshot(t.db);
    const again = await warehouse.post(`/api/jobs/${job.id}/gather`);
    expect(again.status).toBe(409);
    expect(again.body.error.message).toMatch(/Nothing this job holds/);
    expect(await stockSnapshot(t.db)).toEqual(before);
  });

  it('without a preferred warehouse, moves held units to the one its reservation started from (first by rank)', async () => {
    const p = await stocked([
      [main, 'M-3', 1],
      [north, 'N-3', 2],
    ]);
    const job = await orderedJob(sales, [{ sku: p.sku, qty: 3 }], { companyId: installer.companyId });
    const reserved = (await sales.post(`/api/jobs/${job.id}/reserve`).expect(200)).body.data;
    expect(reserved.reservations.map((r: { warehouse: string; needsTransfer: boolean }) => [r.warehouse, r.needsTransfer])).toEqual([
      ['JMAIN', false],
      ['JNTH', true],
    ]);
    const res = await warehouse.post(`/api/jobs/${job.id}/gather`);
    expect(res.status, res.text).toBe(200);
    expect(res.body.data.reservations).toEqual([{ sku: p.sku, warehouse: 'JMAIN', bin: 'M-3', qty: 3, needsTransfer: false, expiresAt: null }]);
  });

  it('takes the preferred warehouse first, then others (flagged as a transfer), and backorders the rest', async () => {
    const p = await stocked([
      [north, 'N-1', 3],
      [main, 'M-1', 2],
    ]);
    const job = await orderedJob(sales, [{ sku: p.sku, qty: 7 }], { companyId: installer.companyId, preferredWarehouse: 'JNTH' });
    const res = await sales.post(`/api/jobs/${job.id}/reserve`);
    expect(res.status, res.text).toBe(200);
    const j = res.body.data;
    expect(j.status).toBe('part-reserved');
    expect(j.reservations).toEqual([
      { sku: p.sku, warehouse: 'JMAIN', bin: 'M-1', qty: 2, needsTransfer: true, expiresAt: null },
      { sku: p.sku, warehouse: 'JNTH', bin: 'N-1', qty: 3, needsTransfer: false, expiresAt: null },
    ]); // listed by warehouse rank; the preferred (JNTH) was used up first
    expect(j.lines[0]).toMatchObject({ qty: 7, reserved: 5, backordered: 2, available: 0, short: 2 });
    expect(j.backorders).toMatchObject([{ sku: p.sku, qty: 2, position: 1, unitsAhead: 0 }]);
    expect(j.history.map((h: { status: string }) => h.status)).toEqual(['draft', 'ordered', 'part-reserved']);
    // The installer sees the same job: available and short, backorders, never on hand.
    const mine = (await installer.get(`/api/jobs/${job.id}`).expect(200)).body.data;
    expect(mine.backorders).toHaveLength(1);
    expect(JSON.stringify(mine)).not.toMatch(/onHand/);
  });

  it('prices every line and totals with GST on the invoice total (decimal arithmetic)', async () => {
    const parts = await Promise.all([0, 1, 2].map(() => stocked([[main, 'P-1', 5]], 35)));
    const created = await sales.post('/api/jobs').send({ companyId: installer.companyId, reference: ref(), lines: parts.map((p) => ({ sku: p.sku, qty: 1 })) });
    const j = created.body.data;
    expect(j.lines.map((l: { lineTotalCents: number }) => l.lineTotalCents)).toEqual([35, 35, 35]);
    // domain.md §5: three lines of $0.35 ex GST → $0.11 GST by the total-invoice rule (ATO, GST Act s 9-90).
    expect(j.totals).toEqual({ subtotalCents: 105, gstCents: 11, totalCents: 116, unpricedLines: 0 });
  });

  it('refuses to reserve a cancelled, closed or fully reserved job (409) and changes nothing', async () => {
    const p = await stocked([[main, 'R-1', 10]]);
    const full = await orderedJob(sales, [{ sku: p.sku, qty: 2 }], { companyId: installer.companyId });
    expect((await sales.post(`/api/jobs/${full.id}/reserve`)).body.data.status).toBe('reserved');
    let before = await stockSnapshot(t.db);
    const again = await sales.post(`/api/jobs/${full.id}/reserve`);
    expect(again.status).toBe(409);
    expect(again.body.error.message).toMatch(/already reserved/);
    expect(await stockSnapshot(t.db)).toEqual(before);

    const cancelled = await orderedJob(sales, [{ sku: p.sku, qty: 2 }], { companyId: installer.companyId });
    await sales.post(`/api/jobs/${cancelled.id}/cancel`).expect(200);
    before = await stockSnapshot(t.db);
    const c = await sales.post(`/api/jobs/${cancelled.id}/reserve`);
    expect(c.status).toBe(409);
    expect(c.body.error.message).toMatch(/cancelled/);

    const closed = await orderedJob(sales, [{ sku: p.sku, qty: 1 }], { companyId: installer.companyId });
    await t.db.execute(sql`update jobs set status = 'closed' where id = ${closed.id}`);
    before = await stockSnapshot(t.db);
    const k = await sales.post(`/api/jobs/${closed.id}/reserve`);
    expect(k.status).toBe(409);
    expect(k.body.error.message).toMatch(/closed/);
    expect(await stockSnapshot(t.db)).toEqual(before);
  });

  it('releases on request and on cancel: units go back, backorders go', async () => {
    const p = await stocked([[main, 'L-1', 4]]);
    const job = await orderedJob(sales, [{ sku: p.sku, qty: 6 }], { companyId: installer.companyId });
    await sales.post(`/api/jobs/${job.id}/reserve`).expect(200);
    const released = (await sales.post(`/api/jobs/${job.id}/release`).expect(200)).body.data;
    expect(released.status).toBe('ordered');
    expect(released.reservations).toEqual([]);
    expect(released.backorders).toEqual([]);
    const levels = (await sales.get(`/api/stock?sku=${p.sku}`)).body.data;
    expect(levels).toMatchObject([{ onHand: 4, reserved: 0, available: 4 }]);
    await sales.post(`/api/jobs/${job.id}/reserve`).expect(200);
    const cancelled = (await sales.post(`/api/jobs/${job.id}/cancel`).expect(200)).body.data;
    expect(cancelled.status).toBe('cancelled');
    expect(cancelled.reservations).toEqual([]);
    expect((await sales.get(`/api/stock?sku=${p.sku}`)).body.data).toMatchObject([{ reserved: 0 }]);
    expect((await sales.post(`/api/jobs/${job.id}/cancel`)).status).toBe(409);
  });

  it('hands units freed by a cancellation straight to the next job waiting for them', async () => {
    const p = await stocked([[main, 'C-1', 2]]);
    const holder = await orderedJob(sales, [{ sku: p.sku, qty: 2 }], { companyId: installer.companyId });
    await sales.post(`/api/jobs/${holder.id}/reserve`).expect(200);
    const waiter = await orderedJob(sales, [{ sku: p.sku, qty: 1 }], { companyId: installer2.companyId });
    expect((await sales.post(`/api/jobs/${waiter.id}/reserve`).expect(200)).body.data.backorders).toMatchObject([{ qty: 1 }]);
    await sales.post(`/api/jobs/${holder.id}/cancel`).expect(200);
    const after = (await sales.get(`/api/jobs/${waiter.id}`)).body.data;
    expect(after.status).toBe('reserved');
    expect(after.backorders).toEqual([]);
    expect((await sales.get(`/api/stock?sku=${p.sku}`)).body.data).toMatchObject([{ onHand: 2, reserved: 1, available: 1 }]);
  });

  it('will not let an adjustment take on hand below what is reserved (409)', async () => {
    const p = await stocked([[main, 'Q-1', 5]]);
    const job = await orderedJob(sales, [{ sku: p.sku, qty: 4 }], { companyId: installer.companyId });
    await sales.post(`/api/jobs/${job.id}/reserve`).expect(200);
    const before = await stockSnapshot(t.db);
    const res = await warehouse.post('/api/stock/adjustments').send({ sku: p.sku, warehouse: 'JMAIN', bin: 'Q-1', qty: -2, reason: 'Damaged' });
    expect(res.status).toBe(409);
    expect(await stockSnapshot(t.db)).toEqual(before);
  });

  it('fills backorders oldest first on receipt, in the same transaction, and says which jobs are now fully reserved', async () => {
    const p = await stocked([[main, 'F-1', 1]]);
    const first = await orderedJob(sales, [{ sku: p.sku, qty: 3 }], { companyId: installer.companyId });
    await sales.post(`/api/jobs/${first.id}/reserve`).expect(200); // holds 1, waits for 2
    clock = new Date(clock.getTime() + 60_000);
    const second = await orderedJob(sales, [{ sku: p.sku, qty: 2 }], { companyId: installer2.companyId });
    await sales.post(`/api/jobs/${second.id}/reserve`).expect(200); // waits for 2
    const queued = (await sales.get(`/api/jobs/${second.id}`)).body.data.backorders;
    expect(queued).toMatchObject([{ qty: 2, position: 2, unitsAhead: 2 }]);
    const receipt = await warehouse.post('/api/stock/receipts').send({ warehouse: 'JMAIN', lines: [{ sku: p.sku, bin: 'F-1', qty: 3 }] });
    expect(receipt.status, receipt.text).toBe(201);
    expect(receipt.body.data.filledJobs).toEqual(
      expect.arrayContaining([
        expect.objectContaining({ id: first.id, status: 'reserved', units: 2 }),
        expect.objectContaining({ id: second.id, status: 'part-reserved', units: 1 }),
      ]),
    );
    const a = (await sales.get(`/api/jobs/${first.id}`)).body.data;
    const b = (await sales.get(`/api/jobs/${second.id}`)).body.data;
    expect(a.status).toBe('reserved');
    expect(a.history.at(-1)).toMatchObject({ status: 'reserved', by: null });
    expect(b.lines[0]).toMatchObject({ reserved: 1, backordered: 1 });
    expect(b.backorders).toMatchObject([{ qty: 1, position: 1 }]);
  });
});

describe('quote holds', () => {
  it('a draft’s reservation holds units until it lapses; pg-boss releases it once the clock has moved on', async () => {
    const p = await stocked([[main, 'H-1', 5]]);
    const created = (await sales.post('/api/jobs').send({ companyId: installer.companyId, reference: ref('QUOTE'), lines: [{ sku: p.sku, qty: 8 }] }).expect(201)).body.data;
    const held = (await sales.post(`/api/jobs/${created.id}/reserve`).expect(200)).body.data;
    expect(held.status).toBe('draft');
    expect(held.backorders).toEqual([]); // a quote queues for nothing
    expect(held.reservations).toMatchObject([{ qty: 5 }]);
    expect(held.holdExpiresAt).toBe(new Date(clock.getTime() + 7 * 86_400_000).toISOString());

    const boss = await startScheduler({ connectionString: t.dbUrl, jobs: t.services.jobs, logger: { info: () => {}, error: () => {} }, pollingIntervalSeconds: 0.5 });
    try {
      const run = async () => {
        const id = (await boss.send(QUOTE_EXPIRY_QUEUE, {}))!;
        for (let i = 0; i < 100; i++) {
          const job = await boss.getJobById(QUOTE_EXPIRY_QUEUE, id);
          if (job && ['completed', 'failed'].includes(job.state)) return job;
          await new Promise((r) => setTimeout(r, 100));
        }
        throw new Error('the expiry job did not run');
      };
      clock = new Date(clock.getTime() + 6 * 86_400_000); // not yet
      expect((await run()).state).toBe('completed');
      expect((await sales.get(`/api/jobs/${created.id}`)).body.data.reservations).toHaveLength(1);
      clock = new Date(clock.getTime() + 2 * 86_400_000); // 8 days on
      expect((await run()).state).toBe('completed');
    } finally {
      await boss.stop({ graceful: false, close: true });
    }
    const after = (await sales.get(`/api/jobs/${created.id}`)).body.data;
    expect(after.reservations).toEqual([]);
    expect(after.status).toBe('draft');
    expect(after.history.at(-1).note).toMatch(/lapsed: 5 units/);
    expect((await sales.get(`/api/stock?sku=${p.sku}`)).body.data).toMatchObject([{ reserved: 0, available: 5 }]);
  });

  it('ordering a held quote makes its units the order’s: no expiry, the rest backordered', async () => {
    const p = await stocked([[main, 'H-2', 2]]);
    const created = (await sales.post('/api/jobs').send({ companyId: installer.companyId, reference: ref('QUOTE'), lines: [{ sku: p.sku, qty: 3 }] }).expect(201)).body.data;
    await sales.post(`/api/jobs/${created.id}/reserve`).expect(200);
    const ordered = (await installer.post(`/api/jobs/${created.id}/order`).expect(200)).body.data;
    expect(ordered.status).toBe('part-reserved');
    expect(ordered.reservations).toMatchObject([{ qty: 2, expiresAt: null }]);
    expect(ordered.backorders).toMatchObject([{ qty: 1 }]);
    expect((await t.services.jobs.expireQuoteHolds(new Date(clock.getTime() + 30 * 86_400_000))).units).toBe(0);
  });
});
