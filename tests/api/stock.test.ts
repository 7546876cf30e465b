import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { sql } from 'drizzle-orm';
import { createTestApp, TEST_ORIGIN, type TestApp } from '../support/app.ts';
import { ledgerDifferences, stockSnapshot } from '../support/ledger.ts';
import { makeStockPart, makeWarehouse, putStock } from '../../seed/factories.ts';

let t: TestApp;
let warehouse: Awaited<ReturnType<TestApp['signIn']>>;
let sales: Awaited<ReturnType<TestApp['signIn']>>;
let installer: Awaited<ReturnType<TestApp['signIn']>>;
let admin: Awaited<ReturnType<TestApp['signIn']>>;
let main: { id: string };
let north: { id: string };

beforeAll(async () => {
  t = await createTestApp();
  main = await makeWarehouse(t.db, { code: 'MAIN', rank: 1 });
  north = await makeWarehouse(t.db, { code: 'NTH', rank: 2 });
  warehouse = await t.signIn('warehouse'); // first: it makes the wholesaler company
  [sales, installer, admin] = await Promise.all([t.signIn('sales'), t.signIn('installer'), t.signIn('admin')]);
});
afterAll(() => t.close());
// The ledger explains every unit after every test.
afterEach(async () => expect(await ledgerDifferences(t.db)).toEqual([]));

const post = (agent: typeof warehouse, path: string, body: unknown) => agent.post(path).set('origin', TEST_ORIGIN).send(body as object);

async function level(sku: string, wh = 'MAIN') {
  const res = await sales.get(`/api/stock?sku=${sku}&warehouse=${wh}`);
  return res.body.data as { bin: string; onHand: number; reserved: number; available: number }[];
}

describe('stock access', () => {
  it('asks for a session, and keeps stock from installers', async () => {
    expect((await request(t.app).get('/api/stock')).status).toBe(401);
    expect((await request(t.app).get('/api/stock/movements')).status).toBe(401);
    expect((await installer.get('/api/stock')).status).toBe(403);
    expect((await installer.get('/api/stock/movements')).status).toBe(403);
    expect((await installer.get('/api/stock/low')).status).toBe(403);
  });

  it('lets only the warehouse (and admin) change stock', async () => {
    const p = await makeStockPart(t.db);
    for (const agent of [sales, installer]) {
      expect((await post(agent, '/api/stock/adjustments', { sku: p.sku, warehouse: 'MAIN', bin: 'A-01', qty: 5, reason: 'Found in returns cage' })).status).toBe(403);
      expect((await post(agent, '/api/stock/receipts', { warehouse: 'MAIN', lines: [{ sku: p.sku, bin: 'A-01', qty: 5 }] })).status).toBe(403);
      expect((await post(agent, '/api/stock/transfers', { sku: p.sku, fromWarehouse: 'MAIN', fromBin: 'A-01', toWarehouse: 'NTH', toBin: 'B-01', qty: 1 })).status).toBe(403);
    }
    expect((await post(sales, '/api/warehouses', { code: 'SOUTH', name: 'South', rank: 3 })).status).toBe(403);
    expect((await post(warehouse, '/api/warehouses', { code: 'SOUTH', name: 'South', rank: 3 })).status).toBe(403);
  });
});

describe('the ledger', () => {
  it('receives into a bin: one movement each, levels in step', async () => {
    const p = await makeStockPart(t.db);
    const res = await post(warehouse, '/api/stock/receipts', { warehouse: 'MAIN', reference: 'DOCKET-7781', lines: [{ sku: p.sku, bin: 'A-01', qty: 12 }] });
    expect(res.status).toBe(201);
    expect(res.body.data).toMatchObject({ reference: 'DOCKET-7781', movements: 1, filledJobs: [] });
    expect(await level(p.sku)).toMatchObject([{ bin: 'A-01', onHand: 12, reserved: 0, available: 12 }]);
    const moves = await sales.get(`/api/stock/movements?sku=${p.sku}`);
    expect(moves.body.data).toMatchObject([{ kind: 'receive', qty: 12, reference: 'DOCKET-7781', warehouse: 'MAIN', bin: 'A-01' }]);
    expect(moves.body.data[0].by).toBe('Test warehouse');
  });

  it('refuses the same receipt reference twice (409) and changes nothing', async () => {
    const p = await makeStockPart(t.db);
    expect((await post(warehouse, '/api/stock/receipts', { warehouse: 'MAIN', reference: 'DOCKET-1', lines: [{ sku: p.sku, bin: 'A-01', qty: 2 }] })).status).toBe(201);
    const before = await stockSnapshot(t.db);
    const res = await post(warehouse, '/api/stock/receipts', { warehouse: 'MAIN', reference: 'DOCKET-1', lines: [{ sku: p.sku, bin: 'A-01', qty: 2 }] });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('conflict');
    expect(await stockSnapshot(t.db)).toEqual(before);
  });

  it('adjusts with a reason; without one, or with a bad quantity, it is 400 and nothing changes', async () => {
    const p = await makeStockPart(t.db);
    await putStock(t.db, p.id, main.id, 'A-02', 10);
    const before = await stockSnapshot(t.db);
    const bad = [
      { sku: p.sku, warehouse: 'MAIN', bin: 'A-02', qty: -2 },
      { sku: p.sku, warehouse: 'MAIN', bin: 'A-02', qty: -2, reason: '' },
      { sku: p.sku, warehouse: 'MAIN', bin: 'A-02', qty: 0, reason: 'Nothing' },
      { sku: p.sku, warehouse: 'MAIN', bin: 'A-02', qty: 1.5, reason: 'Half a unit' },
      { sku: p.sku, warehouse: 'MAIN', bin: 'A-02', qty: '3', reason: 'Text' },
    ];
    for (const body of bad) {
      const res = await post(warehouse, '/api/stock/adjustments', body);
      expect(res.status, JSON.stringify(body)).toBe(400);
      expect(res.body).toMatchObject({ error: { code: 'validation_failed' }, requestId: expect.any(String) });
    }
    expect(await stockSnapshot(t.db)).toEqual(before);
    const ok = await post(warehouse, '/api/stock/adjustments', { sku: p.sku, warehouse: 'MAIN', bin: 'A-02', qty: -3, reason: 'Crushed by forklift' });
    expect(ok.status).toBe(201);
    expect(await level(p.sku)).toMatchObject([{ onHand: 7 }]);
    const moves = await sales.get(`/api/stock/movements?sku=${p.sku}&kind=adjust`);
    expect(moves.body.data).toMatchObject([{ qty: -3, reason: 'Crushed by forklift' }]);
  });

  it('names an unknown SKU or warehouse (400) and changes nothing', async () => {
    const p = await makeStockPart(t.db);
    const before = await stockSnapshot(t.db);
    const sku = await post(warehouse, '/api/stock/receipts', { warehouse: 'MAIN', lines: [{ sku: p.sku, bin: 'A-01', qty: 1 }, { sku: 'NO-SUCH-PART', bin: 'A-01', qty: 1 }] });
    expect(sku.status).toBe(400);
    expect(sku.body.error.message).toContain('NO-SUCH-PART');
    const wh = await post(warehouse, '/api/stock/adjustments', { sku: p.sku, warehouse: 'ATLANTIS', bin: 'A-01', qty: 1, reason: 'Found' });
    expect(wh.status).toBe(400);
    expect(wh.body.error.message).toContain('ATLANTIS');
    const zero = await post(warehouse, '/api/stock/receipts', { warehouse: 'MAIN', lines: [{ sku: p.sku, bin: 'A-01', qty: 0 }] });
    expect(zero.status).toBe(400);
    expect(await stockSnapshot(t.db)).toEqual(before);
  });

  it('will not take on hand below zero (409), and changes nothing', async () => {
    const p = await makeStockPart(t.db);
    await putStock(t.db, p.id, main.id, 'A-03', 4);
    const before = await stockSnapshot(t.db);
    const res = await post(warehouse, '/api/stock/adjustments', { sku: p.sku, warehouse: 'MAIN', bin: 'A-03', qty: -5, reason: 'Write-off' });
    expect(res.status).toBe(409);
    expect(await stockSnapshot(t.db)).toEqual(before);
  });

  it('transfers free units as an out and an in with one reference', async () => {
    const p = await makeStockPart(t.db);
    await putStock(t.db, p.id, main.id, 'A-04', 6);
    const res = await post(warehouse, '/api/stock/transfers', { sku: p.sku, fromWarehouse: 'MAIN', fromBin: 'A-04', toWarehouse: 'NTH', toBin: 'B-04', qty: 4, reason: 'Stock for the north run' });
    expect(res.status).toBe(201);
    expect(await level(p.sku, 'MAIN')).toMatchObject([{ onHand: 2 }]);
    expect(await level(p.sku, 'NTH')).toMatchObject([{ bin: 'B-04', onHand: 4 }]);
    const moves = (await sales.get(`/api/stock/movements?sku=${p.sku}`)).body.data as { kind: string; qty: number; reference: string }[];
    const out = moves.find((m) => m.kind === 'transfer-out')!;
    const inn = moves.find((m) => m.kind === 'transfer-in')!;
    expect([out.qty, inn.qty]).toEqual([-4, 4]);
    expect(out.reference).toBe(inn.reference);
    const before = await stockSnapshot(t.db);
    const tooMany = await post(warehouse, '/api/stock/transfers', { sku: p.sku, fromWarehouse: 'MAIN', fromBin: 'A-04', toWarehouse: 'NTH', toBin: 'B-04', qty: 3 });
    expect(tooMany.status).toBe(409);
    expect(await stockSnapshot(t.db)).toEqual(before);
  });

  it('turns a count into a count correction', async () => {
    const p = await makeStockPart(t.db);
    await putStock(t.db, p.id, north.id, 'C-01', 9);
    const res = await post(warehouse, '/api/stock/counts', { sku: p.sku, warehouse: 'NTH', bin: 'C-01', counted: 7 });
    expect(res.status).toBe(201);
    expect(await level(p.sku, 'NTH')).toMatchObject([{ onHand: 7 }]);
    expect((await sales.get(`/api/stock/movements?sku=${p.sku}&kind=count-correction`)).body.data).toMatchObject([{ qty: -2 }]);
  });

  it('lists parts at or below their minimum', async () => {
    const p = await makeStockPart(t.db);
    await putStock(t.db, p.id, main.id, 'A-05', 3);
    expect((await warehouse.put(`/api/stock/limits/${p.sku}`).set('origin', TEST_ORIGIN).send({ min: 5, max: 20 })).status).toBe(200);
    const low = (await sales.get('/api/stock/low')).body.data as { sku: string; toMax: number }[];
    expect(low.find((l) => l.sku === p.sku)).toMatchObject({ available: 3, min: 5, max: 20, toMax: 17 });
    expect((await warehouse.put(`/api/stock/limits/${p.sku}`).set('origin', TEST_ORIGIN).send({ min: 5, max: 2 })).status).toBe(400);
    // The refused change left the saved levels alone; the part page reads them back.
    expect((await sales.get(`/api/stock/settings/${p.sku}`)).body.data).toMatchObject({ sku: p.sku, limits: { min: 5, max: 20 }, defaultBins: [] });
  });

  it('lets admin manage warehouses, bins and default bins', async () => {
    const created = await post(admin, '/api/warehouses', { code: 'south', name: 'South yard', rank: 3 });
    expect(created.status).toBe(201);
    const id = created.body.data.id as string;
    expect((await post(admin, '/api/warehouses', { code: 'SOUTH', name: 'Again', rank: 4 })).status).toBe(409);
    expect((await post(admin, `/api/warehouses/${id}/bins`, { code: 'S-01', pickOrder: 10 })).status).toBe(201);
    const p = await makeStockPart(t.db);
    expect((await admin.put('/api/stock/default-bins').set('origin', TEST_ORIGIN).send({ sku: p.sku, warehouse: 'SOUTH', bin: 'S-01' })).status).toBe(200);
    // Receiving without a bin goes to the default bin.
    expect((await post(admin, '/api/stock/receipts', { warehouse: 'SOUTH', lines: [{ sku: p.sku, qty: 2 }] })).status).toBe(201);
    expect(await level(p.sku, 'SOUTH')).toMatchObject([{ bin: 'S-01', onHand: 2 }]);
    expect((await sales.get(`/api/stock/settings/${p.sku}`)).body.data).toEqual({ sku: p.sku, limits: null, defaultBins: [{ warehouse: 'SOUTH', bin: 'S-01' }] });
    expect((await sales.get('/api/stock/settings/NO-SUCH-SKU')).status).toBe(400);
    const list = (await sales.get('/api/warehouses')).body.data as { code: string; bins: { code: string }[] }[];
    expect(list.find((w) => w.code === 'SOUTH')!.bins.map((b) => b.code)).toEqual(['S-01']);
  });
});

describe('the database is the last line', () => {
  it('rejects oversell and negative stock even from raw SQL', async () => {
    const p = await makeStockPart(t.db);
    await putStock(t.db, p.id, main.id, 'A-06', 2);
    const codeOf = async (q: ReturnType<typeof sql>) => {
      try {
        await t.db.execute(q);
        return 'ok';
      } catch (e) {
        return (e as { cause?: { code?: string } }).cause?.code;
      }
    };
    expect(await codeOf(sql`update stock_levels set reserved = 3 where part_id = ${p.id}`)).toBe('23514');
    expect(await codeOf(sql`update stock_levels set on_hand = -1 where part_id = ${p.id}`)).toBe('23514');
    expect(await codeOf(sql`update stock_levels set reserved = -1 where part_id = ${p.id}`)).toBe('23514');
    expect(await codeOf(sql`insert into stock_movements (part_id, warehouse_id, bin, qty, kind) values (${p.id}, ${main.id}, 'A-06', 0, 'adjust')`)).toBe('23514');
    expect(await level(p.sku)).toMatchObject([{ onHand: 2, reserved: 0 }]);
  });
});
