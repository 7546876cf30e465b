// Receiving serialised parts: one serial per unit into its bin, refused when missing, doubled or
// already known, and picked later against the serials received.
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { sql } from 'drizzle-orm';
import { createTestApp, type TestApp } from '../support/app.ts';
import { ledgerDifferences, stockSnapshot } from '../support/ledger.ts';
import { makePart, makeStockPart, makeWarehouse } from '../../seed/factories.ts';
import { post, type Agent } from '../support/pick-kit.ts';

let t: TestApp;
let warehouse: Agent;
beforeAll(async () => {
  t = await createTestApp();
  await makeWarehouse(t.db, { code: 'MAIN', rank: 1 });
  warehouse = await t.signIn('warehouse');
});
afterAll(() => t.close());
afterEach(async () => expect(await ledgerDifferences(t.db)).toEqual([]));

let n = 0;
const moduleSku = async () => (await makePart(t.db, { sku: `TST-RMOD-${++n}`, category: 'module', attributes: { category: 'module', nominalV: 51.2, ratedAh: 100, chemistry: 'LFP' } as never })).sku;

describe('receiving serialised parts', () => {
  it('books each unit’s serial into the bin with the receipt, beside plain parts by quantity', async () => {
    const sku = await moduleSku();
    const plain = await makeStockPart(t.db);
    const res = await post(warehouse, '/api/stock/receipts', { warehouse: 'MAIN', reference: 'DOCKET-S1', lines: [{ sku, bin: 'R-01', qty: 3, serials: ['RX-001', 'RX-002', 'RX-003'] }, { sku: plain.sku, bin: 'R-02', qty: 10 }] });
    expect(res.status).toBe(201);
    expect(res.body.data).toMatchObject({ reference: 'DOCKET-S1', movements: 2 });
    const { rows } = await t.db.execute<{ serial: string; state: string; bin: string; receipt_reference: string }>(sql`select s.serial, s.state, s.bin, s.receipt_reference from part_serials s join parts p on p.id = s.part_id where p.sku = ${sku} order by s.serial`);
    expect(rows).toEqual(['RX-001', 'RX-002', 'RX-003'].map((serial) => ({ serial, state: 'in-stock', bin: 'R-01', receipt_reference: 'DOCKET-S1' })));
  });

  it('refuses a serialised part without serials, serials on a counted part, a serial twice and one already in stock, changing nothing', async () => {
    const sku = await moduleSku();
    const plain = await makeStockPart(t.db);
    await post(warehouse, '/api/stock/receipts', { warehouse: 'MAIN', lines: [{ sku, bin: 'R-01', qty: 1, serials: ['RX-100'] }] });
    const before = await stockSnapshot(t.db);
    const serialCount = async () => (await t.db.execute<{ n: number }>(sql`select count(*)::int as n from part_serials`)).rows[0]!.n;
    const serialsBefore = await serialCount();

    const missing = await post(warehouse, '/api/stock/receipts', { warehouse: 'MAIN', lines: [{ sku, bin: 'R-01', qty: 2 }] });
    expect(missing.status).toBe(400);
    expect(missing.body.error.details.fields).toEqual([{ path: 'lines.0.serials', message: `${sku} is serialised: give the serial of each of the 2 units.` }]);
    const counted = await post(warehouse, '/api/stock/receipts', { warehouse: 'MAIN', lines: [{ sku: plain.sku, bin: 'R-02', qty: 1, serials: ['P-1'] }] });
    expect(counted.status).toBe(400);
    expect(counted.body.error.message).toBe(`${plain.sku} is not serialised: it is received by quantity only.`);
    const short = await post(warehouse, '/api/stock/receipts', { warehouse: 'MAIN', lines: [{ sku, bin: 'R-01', qty: 2, serials: ['RX-200'] }] });
    expect(short.status).toBe(400);
    expect(short.body.error.details.fields[0]).toMatchObject({ path: 'lines.0.serials', message: 'Give one serial per unit received.' });
    const twice = await post(warehouse, '/api/stock/receipts', { warehouse: 'MAIN', lines: [{ sku, bin: 'R-01', qty: 2, serials: ['RX-300', 'rx-300'] }] });
    expect(twice.status).toBe(400);
    expect(twice.body.error.message).toBe('Serial rx-300 is given twice.');
    const known = await post(warehouse, '/api/stock/receipts', { warehouse: 'MAIN', lines: [{ sku, bin: 'R-01', qty: 1, serials: ['RX-100'] }] });
    expect(known.status).toBe(409);
    expect(known.body.error.message).toBe('Serial RX-100 is already known: in stock.');

    expect(await stockSnapshot(t.db)).toEqual(before);
    expect(await serialCount()).toBe(serialsBefore);
  });

  it('still takes a receipt without serials for plain parts (the existing contract)', async () => {
    const plain = await makeStockPart(t.db);
    const res = await post(warehouse, '/api/stock/receipts', { warehouse: 'MAIN', lines: [{ sku: plain.sku, bin: 'R-02', qty: 4 }] });
    expect(res.status).toBe(201);
    expect(res.body.data.filledJobs).toEqual([]);
  });

  it('notes the purchase order a receipt came against on its movements', async () => {
    const plain = await makeStockPart(t.db);
    const me = { userId: warehouse.userId, name: 'Test warehouse', email: 'w@example.test', role: 'warehouse' as const, companyId: warehouse.companyId };
    const r = await t.services.stock.receive(me, { warehouse: 'MAIN', lines: [{ sku: plain.sku, bin: 'R-03', qty: 2 }] }, { purchaseOrder: 'PO-0042' });
    const { rows } = await t.db.execute<{ reason: string }>(sql`select reason from stock_movements where reference = ${r.reference}`);
    expect(rows).toEqual([{ reason: 'Against purchase order PO-0042' }]);
  });
});
