// A job ready to pick, for the warehouse tests: 2 modules with cells (serialised) in MAIN B-20,
// 5 brackets with a GTIN in MAIN A-10, 3 cable covers without one in NTH C-05.
import { expect } from 'vitest';
import { makePart, putStock } from '../../seed/factories.ts';
import { gs1CheckDigit } from '../../shared/domain/gtin.ts';
import { TEST_ORIGIN, type TestApp } from './app.ts';

export type Agent = Awaited<ReturnType<TestApp['signIn']>>;

/** A GTIN-13 under GS1's documentation prefix, with its check digit (GS1 General Specifications §7.9.1). */
export const docGtin = (item: number) => {
  const body = `0614141${String(item).padStart(5, '0')}`;
  return body + gs1CheckDigit(body);
};

let n = 0;
export const scanId = () => `test-${Date.now().toString(36)}-${(n++).toString(36)}-${Math.random().toString(36).slice(2, 8)}`;
export const post = (agent: Agent, path: string, body: unknown = {}) => agent.post(path).set('origin', TEST_ORIGIN).send(body as object);

let item = 100;
export async function makeKit(t: TestApp, who: { sales: Agent; installer: Agent }, where: { main: { id: string }; north: { id: string } }, reference?: string) {
  item += 10;
  const at = item;
  const ref = reference ?? `PK-${at} Test St`;
  const module = await makePart(t.db, { sku: `TST-MOD-${at}`, name: 'Test module 5 kWh', category: 'module', gtin: docGtin(at), massKg: 48, attributes: { category: 'module', nominalV: 51.2, ratedAh: 100, chemistry: 'LFP' } as never, dangerousGoods: { unNumber: 'UN3480', class: '9', whRating: 5120 } });
  const bracket = await makePart(t.db, { sku: `TST-BRK-${at}`, gtin: docGtin(at + 1) });
  const cover = await makePart(t.db, { sku: `TST-CVR-${at}` });
  await putStock(t.db, module.id, where.main.id, 'B-20', 4, { pickOrder: 20, isDefault: true });
  await putStock(t.db, bracket.id, where.main.id, 'A-10', 10, { pickOrder: 10, isDefault: true });
  await putStock(t.db, cover.id, where.north.id, 'C-05', 6, { pickOrder: 5, isDefault: true });
  const job = await post(who.sales, '/api/jobs', { companyId: who.installer.companyId, reference: ref, siteSuburb: 'Thornbury', sitePostcode: '3071', lines: [{ sku: module.sku, qty: 2 }, { sku: bracket.sku, qty: 5 }, { sku: cover.sku, qty: 3 }] });
  expect(job.status).toBe(201);
  const id = job.body.data.id as string;
  expect((await post(who.sales, `/api/jobs/${id}/order`)).status).toBe(200);
  expect((await post(who.sales, `/api/jobs/${id}/reserve`)).body.data.status).toBe('reserved');
  return { id, reference: ref, module, bracket, cover, moduleGtin14: docGtin(at).padStart(14, '0'), bracketGtin14: docGtin(at + 1).padStart(14, '0') };
}
export type Kit = Awaited<ReturnType<typeof makeKit>>;

/** Scans the whole kit: covers and brackets by quantity, then each module's serial. */
export async function pickKit(agent: Agent, k: Kit, serials: string[]) {
  const scan = (code: string, qty?: number) => post(agent, `/api/jobs/${k.id}/pick/scans`, { code, scanId: scanId(), ...(qty ? { qty } : {}) });
  await scan(k.cover.sku, 3);
  await scan(k.bracket.sku, 5);
  await scan(k.module.sku);
  for (const s of serials) expect((await scan(s)).body.data.accepted).toBe(true);
}
