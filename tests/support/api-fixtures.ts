// The demo scenario plus one of every object the API's path parameters name, and a signed-in
// agent for every caller: shared by the generated access matrix and the hostile-input properties.
import sharp from 'sharp';
import supertest from 'supertest';
import { sql } from 'drizzle-orm';
import { readFile } from 'node:fs/promises';
import { seedDemo } from '../../seed/demo.ts';
import { makeUser } from '../../seed/factories.ts';
import { enqueueMail } from '../../server/services/mail.ts';
import { ROLES } from '../../shared/roles.ts';
import type { TestApp } from './app.ts';
import type { Caller, Fixtures } from './access-table.ts';

export type Agents = Record<Caller, supertest.Agent>;

export interface OpenApiOperation {
  method: string;
  /** As in the document: /api/parts/{sku} */
  path: string;
  key: string;
  operation: {
    parameters?: { name: string; in: 'path' | 'query' | 'header'; required?: boolean; schema?: JsonSchema }[];
    requestBody?: { content: Record<string, { schema?: JsonSchema }> };
  };
}
export type JsonSchema = Record<string, unknown>;

/** Every operation of /api/openapi.json, as "METHOD /path". */
export async function openApiOperations(t: TestApp): Promise<OpenApiOperation[]> {
  const doc = (await supertest(t.app).get('/api/openapi.json').expect(200)).body as { paths: Record<string, Record<string, OpenApiOperation['operation']>> };
  return Object.entries(doc.paths).flatMap(([path, ops]) =>
    Object.entries(ops).map(([method, operation]) => ({ method: method.toUpperCase(), path, key: `${method.toUpperCase()} ${path}`, operation })),
  );
}

const png = () => sharp({ create: { width: 32, height: 24, channels: 3, background: '#3d6f8e' } }).png().toBuffer();

export async function arrangeFixtures(t: TestApp): Promise<{ fixtures: Fixtures; agents: Agents }> {
  await seedDemo(t.db, t.auth, t.services.partsIndex);
  const agents = { anonymous: supertest.agent(t.app) } as Agents;
  for (const role of ROLES) agents[role] = await t.signIn(role);
  agents['other-installer'] = await t.signIn('installer');

  const { rows: partRows } = await t.db.execute<{ sku: string }>(sql`select sku from parts where archived_at is null and lifecycle = 'active' order by sku limit 2`);
  const { rows: rangeRows } = await t.db.execute<{ id: string }>(sql`select id from ranges order by code limit 1`);
  const [sku, archiveSku] = partRows.map((r) => r.sku) as [string, string];
  const range = rangeRows[0]!.id;

  const upload = async () => (await agents.admin.post(`/api/parts/${sku}/media`).attach('file', await png(), 'photo.png').expect(201)).body.data.id as string;
  const media = await upload();
  const mediaToDelete = await upload();
  const saved = await agents.installer.post('/api/stack-plans/saved').send({ name: 'Own company plan', request: { rangeId: range, modules: 3 } }).expect(201);
  const user = await makeUser(t.db, t.auth, { role: 'sales' });
  const job = await agents.installer.post('/api/jobs').send({ reference: 'Own company job', lines: [{ sku, qty: 1 }] }).expect(201);
  const { rows: binRows } = await t.db.execute<{ warehouse: string; bin: string }>(sql`select warehouse_id as warehouse, id as bin from bins order by code limit 1`);
  const { warehouse, bin } = binRows[0]!;
  const invoiced = await agents.installer.post('/api/jobs').send({ reference: 'Own company ordered job', lines: [{ sku, qty: 1 }] }).expect(201);
  await agents.installer.post(`/api/jobs/${invoiced.body.data.id}/order`).expect(200);
  const mail = await enqueueMail(t.db, { event: 'password-reset', to: 'fixture@example.test', data: { name: 'Fixture', url: 'http://127.0.0.1/reset' } });
  // A job ready to pick: one plentiful part, reserved by the trade desk.
  const { rows: stocked } = await t.db.execute<{ sku: string }>(sql`select p.sku from parts p join stock_levels l on l.part_id = p.id where p.archived_at is null group by p.sku order by sum(l.on_hand - l.reserved) desc, p.sku limit 1`);
  const pickSku = stocked[0]!.sku;
  const pickJob = (await agents.admin.post('/api/jobs').send({ reference: 'Matrix pick job', companyId: (agents.installer as unknown as { companyId: string }).companyId, lines: [{ sku: pickSku, qty: 1 }] }).expect(201)).body.data.id as string;
  await agents.admin.post(`/api/jobs/${pickJob}/order`).expect(200);
  await agents.admin.post(`/api/jobs/${pickJob}/reserve`).expect(200);
  const purchasing = await purchasingFixtures(t, agents);
  return {
    fixtures: { sku, archiveSku, media, mediaToDelete, plan: saved.body.data.id, range, user: user.id, customer: (agents.installer as unknown as { companyId: string }).companyId, job: job.body.data.id, warehouse, bin, mail, orderedJob: invoiced.body.data.id, pickJob, pickSku, label: '1', ...purchasing },
    agents,
  };
}

/** A supplier, an uploaded price list, a tier, two draft purchase orders and a sell-price recompute. */
async function purchasingFixtures(t: TestApp, agents: Agents) {
  const { rows } = await t.db.execute<{ supplier: string; sku: string; tier: string }>(sql`
    select s.id as supplier, p.sku, (select id from customer_tiers order by code limit 1) as tier
    from suppliers s join part_supplier_skus ps on ps.supplier_id = s.id join parts p on p.id = ps.part_id
    where s.code = 'KESTREL' and ps.cost_cents is not null order by p.sku limit 1`);
  const { supplier, sku, tier } = rows[0]!;
  const file = await readFile(new URL('../../seed/price-lists/marram-wholesale-2027-03.csv', import.meta.url));
  const priceList = (await agents.purchasing.post('/api/price-lists').field('supplierId', supplier).attach('file', file, 'prices.csv').expect(201)).body.data.id as string;
  const order = async () => (await agents.purchasing.post('/api/purchase-orders').send({ supplier: 'KESTREL', warehouse: 'WST', lines: [{ sku, qty: 2 }] }).expect(201)).body.data.id as string;
  const recompute = (await agents.purchasing.post('/api/pricing/recompute').expect(200)).body.data.id as string;
  return { supplier, priceList, tier, purchaseOrder: await order(), purchaseOrderToDelete: await order(), recompute };
}

/** The path with each {param} filled (already encoded by the caller when it wants raw bytes). */
export function fillPath(path: string, values: Record<string, string>): string {
  return path.replace(/\{(\w+)\}/g, (_m, name: string) => {
    const v = values[name];
    if (v === undefined) throw new Error(`no value for path parameter {${name}} of ${path}`);
    return v;
  });
}
