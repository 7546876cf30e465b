// The planner API with site inputs, prices and the paper copy: what an installer quotes from.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { sql } from 'drizzle-orm';
import { pdfText } from '../support/pdf-text.ts';
import { createTestApp, type TestApp } from '../support/app.ts';
import { seedCatalogue } from '../../seed/catalogue.ts';
import { parts as demoParts } from '../../seed/data/catalogue.ts';
import { winAnsi } from '../../server/documents/pdf-text.ts';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
  await t.db.transaction((tx) => seedCatalogue(tx));
});
afterAll(() => t.close());

const savedCount = async () => ((await t.db.execute(sql`select count(*)::int as n from stack_plans`)).rows[0] as { n: number }).n;
const listPrice = (sku: string) => demoParts.find((p) => p.sku === sku)!.listPriceCents;
const binary = (res: request.Response, cb: (err: Error | null, body: Buffer) => void) => {
  const chunks: Buffer[] = [];
  res.on('data', (c: Buffer) => chunks.push(c));
  res.on('end', () => cb(null, Buffer.concat(chunks)));
};

describe('site inputs', () => {
  it('plans for the site given and states the defaults it assumed', async () => {
    const agent = await t.signIn('installer');
    const res = await agent.post('/api/stack-plans').send({ rangeId: 'HLM-TOR', modules: 2, site: { wall: 'masonry', location: 'garage', cableRunM: 8 } }).expect(200);
    const p = res.body.data;
    expect(p.site).toEqual({ cableRunM: 8, wall: 'masonry', location: 'garage', sharesHabitableWall: false, floor: 'slab', country: 'AU' });
    expect(p.siteAssumed).toHaveLength(3); // shared wall, floor and country were not said
    const skus = p.bom.map((l: { sku: string }) => l.sku);
    expect(skus).toEqual(expect.arrayContaining(['HLM-ACC-FIX-M', 'HLM-ACC-BOLL', 'HLM-CBL-HV6-100', 'HLM-CDT-25']));
    expect(p.bom.find((l: { sku: string }) => l.sku === 'HLM-CDT-25').lengthM).toBe(8); // DVC-C: conduit over the whole 8 m run (AS/NZS 5139:2019)
  });

  it('refuses a bad site with the envelope, and saves nothing', async () => {
    const agent = await t.signIn('installer');
    const before = await savedCount();
    const bad = [
      [{ cableRunM: -2 }, 'site.cableRunM'],
      [{ cableRunM: 5000 }, 'site.cableRunM'],
      [{ cableRunM: 'far' }, 'site.cableRunM'],
      [{ wall: 'plasterboard' }, 'site.wall'],
      [{ location: 'roof' }, 'site.location'],
      [{ country: 'US' }, 'site.country'],
      [{ altitude: 900 }, 'site'],
    ] as const;
    for (const [site, path] of bad) {
      const planned = await agent.post('/api/stack-plans').send({ rangeId: 'HLM-TOR', modules: 2, site });
      expect(planned.status, JSON.stringify(site)).toBe(400);
      expect(planned.body.error.code).toBe('validation_failed');
      expect(planned.body.requestId).toBeTruthy();
      expect(planned.body.error.details.fields.map((f: { path: string }) => f.path).join(' '), JSON.stringify(site)).toContain(path);
      const saved = await agent.post('/api/stack-plans/saved').send({ name: 'Bad site', request: { rangeId: 'HLM-TOR', modules: 2, site } });
      expect(saved.status).toBe(400);
    }
    expect(await savedCount()).toBe(before);
  });

  it('refuses a site no part of the range suits (an IP21 battery outdoors), and saves nothing', async () => {
    const agent = await t.signIn('installer');
    const before = await savedCount();
    const res = await agent.post('/api/stack-plans').send({ rangeId: 'TVP-SL48', modules: 3, site: { location: 'outdoor' } });
    expect(res.status).toBe(400);
    expect(res.body.error.details.code).toBe('site_unsuitable');
    expect(res.body.error.message).toMatch(/IP21/);
    await agent.post('/api/stack-plans/saved').send({ name: 'Outdoor wall', request: { rangeId: 'TVP-SL48', modules: 3, site: { location: 'outdoor' } } }).expect(400);
    expect(await savedCount()).toBe(before);
  });

  it('remembers the site with a saved plan', async () => {
    const agent = await t.signIn('installer');
    const site = { cableRunM: 4.5, wall: 'masonry', location: 'outdoor', sharesHabitableWall: true, floor: 'suspended', country: 'NZ' };
    const saved = await agent.post('/api/stack-plans/saved').send({ name: 'Bach on the hill', request: { rangeId: 'QRB-RIDGE', modules: 3, site } }).expect(201);
    expect(saved.body.data.request.site).toEqual(site);
    const again = await agent.get(`/api/stack-plans/saved/${saved.body.data.id}`).expect(200);
    expect(again.body.data.plan.site).toEqual(site);
    expect(again.body.data.plan.cautions.map((c: { code: string }) => c.code)).toEqual(expect.arrayContaining(['floor_load', 'seismic', 'outdoor', 'habitable_wall']));
  });

  it('refuses a module count and a target together', async () => {
    const agent = await t.signIn('sales');
    const res = await agent.post('/api/stack-plans').send({ rangeId: 'HLM-TOR', modules: 3, targetUsableKwh: 10 });
    expect(res.status).toBe(400);
    expect(res.body.error.details.fields[0].path).toBe('targetUsableKwh');
  });
});

describe('prices', () => {
  it('shows installers list prices per line with subtotal, GST and total, and never cost', async () => {
    const agent = await t.signIn('installer');
    const res = await agent.post('/api/stack-plans').send({ rangeId: 'QRB-HEARTH', modules: 3, inverterSku: 'QRB-INV-5LV', includeInverter: true }).expect(200);
    const p = res.body.data;
    const inverter = p.bom.find((l: { sku: string }) => l.sku === 'QRB-INV-5LV');
    expect(inverter).toMatchObject({ category: 'inverter', qtyUnits: 1, unitPriceCents: listPrice('QRB-INV-5LV') });
    expect(typeof inverter.available).toBe('number');
    const modules = p.bom.find((l: { sku: string }) => l.sku === 'QRB-HEARTH-M51');
    expect(modules.lineTotalCents).toBe(3 * listPrice('QRB-HEARTH-M51'));
    const subtotal = p.bom.reduce((s: number, l: { lineTotalCents: number }) => s + l.lineTotalCents, 0);
    expect(p.totals.subtotalCents).toBe(subtotal);
    expect(p.totals.gstCents).toBe(Math.round(subtotal / 10)); // GST 10 % (GST Act s 9-70) on whole-dollar list prices
    expect(p.totals.totalCents).toBe(subtotal + p.totals.gstCents);
    expect(JSON.stringify(res.body)).not.toMatch(/cost/i);
    const detail = await agent.get('/api/ranges/QRB-HEARTH').expect(200);
    expect(JSON.stringify(detail.body)).not.toMatch(/cost/i);
  });

  it('refuses to include an inverter that was not chosen', async () => {
    const agent = await t.signIn('installer');
    const res = await agent.post('/api/stack-plans').send({ rangeId: 'QRB-HEARTH', modules: 3, includeInverter: true });
    expect(res.status).toBe(400);
    expect(res.body.error.details.fields[0].path).toBe('includeInverter');
  });

  it('puts prices and totals in the CSV', async () => {
    const agent = await t.signIn('installer');
    const csv = await agent.post('/api/stack-plans/bom.csv').send({ rangeId: 'QRB-RIDGE', modules: 2, site: { cableRunM: 6 } }).expect(200);
    const rows = csv.text.replace(/^\uFEFF/, '').trim().split('\r\n');
    expect(rows[0]).toBe('SKU,Part,Category,Qty (units),Pack size,Packs,Length (m),Unit price ex GST,Line total ex GST,Available,Short,Rules,Why');
    const conduit = rows.find((r) => r.startsWith('QRB-CDT-25,'))!;
    expect(conduit).toContain(`,6,1,6,6,${(listPrice('QRB-CDT-25') / 100).toFixed(2)},${((6 * listPrice('QRB-CDT-25')) / 100).toFixed(2)},`); // 6 m at the per-metre list price
    expect(rows.at(-3)).toMatch(/^,Subtotal ex GST,/);
    expect(rows.at(-2)).toMatch(/^,GST 10 %,/);
    expect(rows.at(-1)).toMatch(/^,Total inc GST,/);
  });
});

describe('the plan PDF', () => {
  it('carries every caution whole, the prices and the site', async () => {
    const agent = await t.signIn('installer');
    const body = { rangeId: 'HLM-TOR', modules: 6, stacks: 2, site: { location: 'garage', floor: 'suspended', country: 'NZ', sharesHabitableWall: true, wall: 'masonry', cableRunM: 12 }, inverterSku: 'HLM-INV-5HV1' };
    const planned = await agent.post('/api/stack-plans').send(body).expect(200);
    const pdf = await agent.post('/api/stack-plans/plan.pdf').send(body).buffer(true).parse(binary).expect(200);
    const { text, offPage } = await pdfText(pdf.body as Buffer);
    expect(offPage).toEqual([]); // nothing runs off the right edge
    const cautions = planned.body.data.cautions as { code: string; text: string; source: string }[];
    expect(cautions.length).toBeGreaterThanOrEqual(12);
    for (const c of cautions) {
      // The PDF's fonts speak WinAnsi; the same spelling-out is applied before comparing.
      expect(text, c.code).toContain(winAnsi(c.text).replace(/\s+/g, ' '));
      expect(text, c.code).toContain(winAnsi(c.source));
    }
    expect(text).toContain(`Total (inc GST) ${new Intl.NumberFormat('en-AU', { style: 'currency', currency: 'AUD' }).format(planned.body.data.totals.totalCents / 100)}`);
    expect(text).toMatch(/12 m cable run/);
  });
});
