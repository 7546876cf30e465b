import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { sql } from 'drizzle-orm';
import { createTestApp, TEST_ORIGIN, type TestApp } from '../support/app.ts';
import { ledgerDifferences } from '../support/ledger.ts';
import { makePart, makeStockPart, makeSupplier, makeWarehouse, putStock } from '../../seed/factories.ts';
import { partSupplierSkus, stockLimits } from '../../server/db/schema/index.ts';

let t: TestApp;
type Agent = Awaited<ReturnType<TestApp['signIn']>>;
let purchasing: Agent;
let warehouse: Agent;
let installer: Agent;
let sales: Agent;
let main: { id: string };

beforeAll(async () => {
  t = await createTestApp();
  main = await makeWarehouse(t.db, { code: 'MAIN', rank: 1 });
  warehouse = await t.signIn('warehouse');
  [purchasing, installer, sales] = await Promise.all([t.signIn('purchasing'), t.signIn('installer'), t.signIn('sales')]);
});
afterAll(() => t.close());
afterEach(async () => expect(await ledgerDifferences(t.db)).toEqual([]));

const post = (agent: Agent, path: string, body: unknown = {}) => agent.post(path).set('origin', TEST_ORIGIN).send(body as object);

/** A part with a min/max, sold by two suppliers on different terms. */
async function twoSupplierPart(opts: { onHand: number; min: number; max: number }) {
  const part = await makePart(t.db, { packSize: 1 });
  await putStock(t.db, part.id, main.id, 'A-01', opts.onHand, { isDefault: true });
  await t.db.insert(stockLimits).values({ partId: part.id, minQty: opts.min, maxQty: opts.max });
  const cheapInBulk = await makeSupplier(t.db, { code: `BULK-${part.sku.slice(-4)}`, leadTimeDays: 20, contactEmail: `orders-${part.sku.slice(-4).toLowerCase()}@bulk.test` });
  const quick = await makeSupplier(t.db, { code: `QUICK-${part.sku.slice(-4)}`, leadTimeDays: 2, contactEmail: `sales-${part.sku.slice(-4).toLowerCase()}@quick.test` });
  // Bulk: $10 each, packs of 6, MOQ 12, $8.50 from 24. Quick: $9.50 each, loose.
  await t.db.insert(partSupplierSkus).values([
    { partId: part.id, supplierId: cheapInBulk.id, supplierSku: `B-${part.sku}`, costCents: 1000, packSize: 6, moq: 12, priceBreaks: [{ minQty: 24, costCents: 850 }] },
    { partId: part.id, supplierId: quick.id, supplierSku: `Q-${part.sku}`, costCents: 950, packSize: 1, moq: 1 },
  ]);
  return { part, cheapInBulk, quick };
}

describe('reorder suggestions', () => {
  it('rounds to MOQ and packs and picks the supplier by unit price at that quantity', async () => {
    const { part } = await twoSupplierPart({ onHand: 3, min: 5, max: 23 });
    const res = await purchasing.get('/api/reorder/suggestions');
    expect(res.status).toBe(200);
    const s = res.body.data.find((x: { sku: string }) => x.sku === part.sku);
    // Need 23 − 3 = 20. Bulk: MOQ 12, packs of 6 → 24 units at the 24+ break, $8.50. Quick: 20 at $9.50. Bulk wins (common trade practice: lowest unit cost).
    expect(s).toMatchObject({ available: 3, need: 20, orderQty: 24, supplier: { unitCostCents: 850, packSize: 6, moq: 12 } });
  });

  it('prefers the shorter lead time at the same unit price', async () => {
    const { part, quick } = await twoSupplierPart({ onHand: 1, min: 1, max: 4 });
    await t.db.execute(sql`update part_supplier_skus set cost_cents = 1000, price_breaks = '[]' where part_id = ${part.id}`);
    const s = (await purchasing.get('/api/reorder/suggestions')).body.data.find((x: { sku: string }) => x.sku === part.sku);
    expect(s.supplier.code).toBe(quick.code);
    expect(s.orderQty).toBe(3);
  });

  it('keeps suggestions and orders from installers and sales', async () => {
    for (const agent of [installer, sales]) {
      expect((await agent.get('/api/reorder/suggestions')).status).toBe(403);
      expect((await agent.get('/api/purchase-orders')).status).toBe(403);
    }
  });
});

describe('purchase orders', () => {
  it('draft from suggestions → sent → received through the receipts, on order following', async () => {
    const { part } = await twoSupplierPart({ onHand: 2, min: 5, max: 20 });
    const made = await post(purchasing, '/api/reorder/draft-orders', { lines: [{ sku: part.sku, qty: 18 }] });
    expect(made.status).toBe(201);
    const [po] = made.body.data;
    const detail = (await purchasing.get(`/api/purchase-orders/${po.id}`)).body.data;
    expect(detail).toMatchObject({ status: 'draft', lines: [{ sku: part.sku, qty: 18 }] });
    // 18 at $9.50 = $171.00; GST 10 % (GST Act s 9-70) = $17.10.
    expect(detail.totals).toEqual({ exCents: 17100, gstCents: 1710, incCents: 18810 });

    const pdf = await purchasing.get(`/api/purchase-orders/${po.id}/pdf`);
    expect(pdf.status).toBe(200);
    expect(pdf.headers['content-type']).toBe('application/pdf');

    expect((await post(warehouse, `/api/purchase-orders/${po.id}/receipts`, { lines: [{ lineId: detail.lines[0].id, qty: 1 }] })).status).toBe(409); // not sent yet
    expect((await post(purchasing, `/api/purchase-orders/${po.id}/send`)).status).toBe(200);
    // Sending it queues the order for the supplier's contact, with our SKU, theirs, the quantity and the cost.
    const { rows: sent } = await t.db.execute<{ to: string; subject: string; text: string }>(sql`select "to", subject, text from mail_outbox where event = 'purchase-order' and refs->>'purchaseOrderId' = ${po.id}`);
    expect(sent).toHaveLength(1);
    expect(sent[0]!.to).toBe(detail.supplier.contactEmail);
    expect(sent[0]!.to).toMatch(/@(bulk|quick)\.test$/);
    expect(sent[0]!.subject).toContain(detail.number);
    expect(sent[0]!.text).toMatch(new RegExp(`18 × \\S+ +${part.name}.*\\$9\\.50`));
    const levels = async () => (await warehouse.get(`/api/stock?sku=${part.sku}`)).body.data[0];
    expect((await levels()).onOrder).toBe(18);

    // The warehouse sees what to receive, never the cost.
    const seen = (await warehouse.get(`/api/purchase-orders/${po.id}`)).body.data;
    expect(seen.lines[0].unitCostCents).toBeNull();
    expect(seen.totals).toBeNull();

    const over = await post(warehouse, `/api/purchase-orders/${po.id}/receipts`, { lines: [{ lineId: detail.lines[0].id, qty: 19 }] });
    expect(over.status).toBe(409);
    expect((await levels()).onHand).toBe(2); // nothing booked

    const first = await post(warehouse, `/api/purchase-orders/${po.id}/receipts`, { lines: [{ lineId: detail.lines[0].id, qty: 10 }] });
    expect(first.status).toBe(201);
    expect((await purchasing.get(`/api/purchase-orders/${po.id}`)).body.data.status).toBe('part-received');
    expect(await levels()).toMatchObject({ onHand: 12, onOrder: 8 });
    await post(warehouse, `/api/purchase-orders/${po.id}/receipts`, { lines: [{ lineId: detail.lines[0].id, qty: 8 }] });
    expect((await purchasing.get(`/api/purchase-orders/${po.id}`)).body.data.status).toBe('received');
    expect(await levels()).toMatchObject({ onHand: 20, onOrder: 0 });
    expect((await post(purchasing, `/api/purchase-orders/${po.id}/close`)).status).toBe(200);
  });

  it('fills a waiting backorder when goods arrive against an order', async () => {
    const part = await makeStockPart(t.db);
    const supplier = await makeSupplier(t.db, { code: 'FILLER' });
    await t.db.insert(partSupplierSkus).values({ partId: part.id, supplierId: supplier.id, supplierSku: 'F-1', costCents: 500 });
    await putStock(t.db, part.id, main.id, 'B-01', 1, { isDefault: true });
    const job = await post(sales, '/api/jobs', { reference: 'Backorder site', companyId: installer.companyId, lines: [{ sku: part.sku, qty: 4 }] });
    await post(sales, `/api/jobs/${job.body.data.id}/order`);
    await post(sales, `/api/jobs/${job.body.data.id}/reserve`);
    const po = await post(purchasing, '/api/purchase-orders', { supplier: 'FILLER', warehouse: 'MAIN', lines: [{ sku: part.sku, qty: 5 }] });
    expect(po.status).toBe(201);
    await post(purchasing, `/api/purchase-orders/${po.body.data.id}/send`);
    const lineId = (await purchasing.get(`/api/purchase-orders/${po.body.data.id}`)).body.data.lines[0].id;
    const res = await post(warehouse, `/api/purchase-orders/${po.body.data.id}/receipts`, { lines: [{ lineId, qty: 5 }] });
    expect(res.status).toBe(201);
    expect(res.body.data.filledJobs).toEqual([expect.objectContaining({ reference: 'Backorder site', units: 3 })]);
  });

  it('refuses a supplier that does not sell the part, naming the line', async () => {
    const part = await makeStockPart(t.db);
    await makeSupplier(t.db, { code: 'NOSELL' });
    const res = await post(purchasing, '/api/purchase-orders', { supplier: 'NOSELL', warehouse: 'MAIN', lines: [{ sku: part.sku, qty: 1 }] });
    expect(res.status).toBe(400);
    expect(res.body.error.details.fields).toEqual([{ path: 'lines.0.sku', message: 'Not sold by this supplier.' }]);
  });
});
