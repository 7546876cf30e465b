import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { eq, sql } from 'drizzle-orm';
import { createTestApp, type TestApp } from '../support/app.ts';
import { DEMO_WAREHOUSES, seedCatalogue } from '../../seed/catalogue.ts';
import { ranges } from '../../server/db/schema/index.ts';
import { makeCompany } from '../../seed/factories.ts';
import { ranges as demoRanges } from '../../seed/data/catalogue.ts';

let t: TestApp;
let ids: Record<string, string>;
beforeAll(async () => {
  t = await createTestApp();
  await t.db.transaction((tx) => seedCatalogue(tx));
  const rows = await t.db.select({ id: ranges.id, code: ranges.code }).from(ranges);
  ids = Object.fromEntries(rows.map((r) => [r.code, r.id]));
});
afterAll(() => t.close());

describe('POST /api/stack-plans', () => {
  it('prices an installer’s plan at their company’s discount; the trade desk sees list prices', async () => {
    const company = await makeCompany(t.db, { tierDiscountPct: '12.5' });
    const installer = await t.signIn('installer', { companyId: company.id });
    const sales = await t.signIn('sales');
    const ask = { rangeId: ids['QRB-HEARTH'], modules: 3 };
    const list = (await sales.post('/api/stack-plans').send(ask).expect(200)).body.data;
    const theirs = (await installer.post('/api/stack-plans').send(ask).expect(200)).body.data;
    // The answer says which prices it carries, so the page can say so beside the totals.
    expect(list.discountPct).toBe(0);
    expect(theirs.discountPct).toBe(12.5);
    for (const [i, l] of (list.bom as { sku: string; packs: number; unitPriceCents: number | null }[]).entries()) {
      const mine = theirs.bom[i];
      expect(mine.sku).toBe(l.sku);
      // 12.5 % off, rounded half up to the cent (common practice); e.g. $58.00 → $50.75.
      expect(mine.unitPriceCents).toBe(l.unitPriceCents === null ? null : Math.round((l.unitPriceCents * 875) / 1000));
      expect(mine.lineTotalCents).toBe(mine.unitPriceCents === null ? null : mine.unitPriceCents * l.packs);
    }
    const subtotal = (theirs.bom as { lineTotalCents: number | null }[]).reduce((s, l) => s + (l.lineTotalCents ?? 0), 0);
    expect(theirs.totals.subtotalCents).toBe(subtotal);
    expect(theirs.totals.subtotalCents).toBeLessThan(list.totals.subtotalCents);
    // GST 10 % on the invoice total (GST Act s 9-70, rounded to the cent).
    expect(theirs.totals.gstCents).toBe(Math.round(subtotal / 10));
    expect(theirs.totals.totalCents).toBe(subtotal + theirs.totals.gstCents);
  });

  it('needs a session; warehouse may not plan', async () => {
    await request(t.app).post('/api/stack-plans').send({ rangeId: ids['QRB-HEARTH'], modules: 2 }).expect(401);
    const wh = await t.signIn('warehouse');
    await wh.post('/api/stack-plans').send({ rangeId: ids['QRB-HEARTH'], modules: 2 }).expect(403);
  });

  it('plans a parallel 48 V-class stack: DVC-A, no cable cover, availability on every line', async () => {
    const agent = await t.signIn('installer');
    const res = await agent.post('/api/stack-plans').send({ rangeId: ids['QRB-HEARTH'], modules: 3 }).expect(200);
    const p = res.body.data;
    expect(p.connection).toBe('parallel');
    expect(p.nominalVoltage).toBeCloseTo(51.2, 5); // 16 LFP cells × 3.2 V (common practice)
    expect(p.maxVoltage).toBeCloseTo(58.4, 5); // 16 × 3.65 V full charge (common practice)
    expect(p.dvc).toBe('A'); // ≤ 60 V DC is DVC-A (AS/NZS 5139:2019, classes from IEC 62109-1)
    expect(p.bom.some((l: { category: string }) => l.category === 'cable-cover')).toBe(false);
    expect(p.bom.find((l: { category: string }) => l.category === 'module').qtyUnits).toBe(3);
    // availability is the seeded on hand − reserved summed over both warehouses
    const moduleLine = p.bom.find((l: { category: string }) => l.category === 'module');
    const [{ sum }] = (await t.db.execute(sql`select coalesce(sum(on_hand - reserved), 0)::int as sum from stock_levels s join parts p on p.id = s.part_id where p.sku = ${moduleLine.sku}`)).rows as { sum: number }[];
    expect(moduleLine.available).toBe(sum);
    expect(moduleLine.short).toBe(Math.max(0, 3 - sum));
    // Each warehouse comes with its name, so a column is more than a code.
    const names = Object.fromEntries(DEMO_WAREHOUSES.map((w) => [w.code, w.name]));
    for (const a of moduleLine.availability) expect(a.warehouseName).toBe(names[a.warehouse]);
    expect(moduleLine.reason).toBe('3 modules per stack');
    const feet = p.bom.find((l: { category: string }) => l.category === 'feet');
    expect(feet.packs * feet.packSize).toBe(feet.qtyUnits); // whole packs only (common practice)
    expect(p.cautions.map((c: { code: string }) => c.code)).toEqual(expect.arrayContaining(['licensed_work']));
  });

  it('plans a series high-voltage stack: DVC-C adds the cable-protection cover with its reason', async () => {
    const agent = await t.signIn('sales');
    const res = await agent.post('/api/stack-plans').send({ rangeId: 'HLM-TOR', modules: 4 }).expect(200);
    const p = res.body.data;
    expect(p.connection).toBe('series');
    expect(p.dvc).toBe('C'); // above 120 V DC (AS/NZS 5139:2019 via IEC 62109-1)
    const cover = p.bom.find((l: { category: string }) => l.category === 'cable-cover');
    expect(cover.reason).toMatch(/60 V DC/);
  });

  it('sizes from a target usable energy and an inverter', async () => {
    const agent = await t.signIn('installer');
    const res = await agent.post('/api/stack-plans').send({ rangeId: ids['QRB-HEARTH'], targetUsableKwh: 14, inverterSku: 'QRB-INV-5LV' }).expect(200);
    const p = res.body.data;
    expect(p.usableKwh).toBeGreaterThanOrEqual(14);
    expect(p.inverterFit.fits).toBe(true);
    // smallest count that reaches the target: one module fewer must fall short (definition of "smallest n")
    const fewer = await agent.post('/api/stack-plans').send({ rangeId: ids['QRB-HEARTH'], modules: p.modulesPerStack - 1, stacks: p.stacks }).expect(200);
    expect(fewer.body.data.usableKwh).toBeLessThan(14);
  });

  it('says why a plan does not fit an inverter', async () => {
    const agent = await t.signIn('installer');
    const res = await agent.post('/api/stack-plans').send({ rangeId: 'HLM-TOR', modules: 2, inverterSku: 'QRB-INV-5LV' }).expect(200);
    expect(res.body.data.inverterFit.fits).toBe(false);
    expect(res.body.data.inverterFit.code).toBe('too_high');
    const target = await agent.post('/api/stack-plans').send({ rangeId: 'HLM-TOR', targetUsableKwh: 10, inverterSku: 'QRB-INV-5LV' });
    expect(target.status).toBe(400);
    expect(target.body.error.details.code).toBe('no_fit');
  });

  it('refuses bad input with reasons', async () => {
    const agent = await t.signIn('sales');
    const over = await agent.post('/api/stack-plans').send({ rangeId: ids['QRB-HEARTH'], modules: 9 });
    expect(over.status).toBe(400);
    expect(over.body.error.message).toMatch(/1 to 6/);
    const zero = await agent.post('/api/stack-plans').send({ rangeId: ids['QRB-HEARTH'], targetUsableKwh: 0 });
    expect(zero.status).toBe(400);
    expect(zero.body.error.details.fields[0].path).toBe('targetUsableKwh');
    const unreachable = await agent.post('/api/stack-plans').send({ rangeId: ids['QRB-HEARTH'], targetUsableKwh: 900 });
    expect(unreachable.status).toBe(400);
    expect(unreachable.body.error.details.code).toBe('target_unreachable');
    const nothing = await agent.post('/api/stack-plans').send({ rangeId: ids['QRB-HEARTH'] });
    expect(nothing.status).toBe(400);
    await agent.post('/api/stack-plans').send({ rangeId: 'NO-SUCH-RANGE', modules: 2 }).expect(404);
    await agent.post('/api/stack-plans').send({ rangeId: ids['QRB-HEARTH'], modules: 2, inverterSku: 'NOPE' }).expect(404);
    const notInverter = await agent.post('/api/stack-plans').send({ rangeId: ids['QRB-HEARTH'], modules: 2, inverterSku: 'QRB-HEARTH-M51' });
    expect(notInverter.status).toBe(400);
  });

  it('exports the BOM as CSV and the plan as PDF', async () => {
    const agent = await t.signIn('installer');
    const csv = await agent.post('/api/stack-plans/bom.csv').send({ rangeId: 'TVP-SL48', modules: 7, stacks: 2 }).expect(200);
    expect(csv.headers['content-type']).toMatch(/text\/csv/);
    expect(csv.text.split('\r\n')[0]).toContain('SKU,Part,Category');
    expect(csv.text).toMatch(/1 per 3 modules/i);
    const pdf = await agent.post('/api/stack-plans/plan.pdf').send({ rangeId: 'TVP-SL48', modules: 7, stacks: 2 }).buffer(true).parse((res, cb) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => cb(null, Buffer.concat(chunks)));
    });
    expect(pdf.status).toBe(200);
    expect(pdf.headers['content-type']).toBe('application/pdf');
    expect((pdf.body as Buffer).subarray(0, 5).toString()).toBe('%PDF-');
  });
});

describe('every demo range', () => {
  it('plans every module count from its minimum to its maximum, and refuses one outside', async () => {
    const agent = await t.signIn('sales');
    for (const range of demoRanges) {
      for (let n = range.minModules; n <= range.maxModules; n++) {
        const res = await agent.post('/api/stack-plans').send({ rangeId: range.code, modules: n });
        expect(res.status, `${range.code} × ${n}`).toBe(200);
        expect(res.body.data.bom.find((l: { sku: string }) => l.sku === range.moduleSku).qtyUnits).toBe(n);
        expect(res.body.data.bom.find((l: { sku: string }) => l.sku === range.controllerSku).qtyUnits).toBe(1);
        // drawing and figures agree: one stack is the base plus every unit (domain rule: height = feet + Σ units)
        const units = res.body.data.units as { heightMm: number }[];
        expect(units.reduce((sum, u) => sum + u.heightMm, 0)).toBe(res.body.data.heightMm);
      }
      await agent.post('/api/stack-plans').send({ rangeId: range.code, modules: range.maxModules + 1 }).expect(400);
    }
  });

  it('sizes every range from a reachable target to at least that usable energy', async () => {
    const agent = await t.signIn('sales');
    for (const range of demoRanges) {
      const res = await agent.post('/api/stack-plans').send({ rangeId: range.code, targetUsableKwh: 9 });
      expect(res.status, range.code).toBe(200);
      expect(res.body.data.usableKwh).toBeGreaterThanOrEqual(9);
    }
  });
});

describe('saved plans', () => {
  it('installers save drafts for their own company and never see another company’s', async () => {
    const a = await t.signIn('installer');
    const b = await t.signIn('installer');
    const saved = await a.post('/api/stack-plans/saved').send({ name: 'Garage, 14 Fern St', sitePostcode: '3071', request: { rangeId: ids['QRB-HEARTH'], modules: 3 } }).expect(201);
    expect(saved.body.data.companyId).toBe(a.companyId);
    expect(saved.body.data.usableKwh).toBeGreaterThan(0);
    const mine = await a.get('/api/stack-plans/saved').expect(200);
    expect(mine.body.data.map((p: { id: string }) => p.id)).toContain(saved.body.data.id);
    const theirs = await b.get('/api/stack-plans/saved').expect(200);
    expect(theirs.body.data.map((p: { id: string }) => p.id)).not.toContain(saved.body.data.id);
    await b.get(`/api/stack-plans/saved/${saved.body.data.id}`).expect(404);
    await b.get(`/api/stack-plans/saved/${saved.body.data.id}/bom.csv`).expect(404);
    const again = await a.get(`/api/stack-plans/saved/${saved.body.data.id}`).expect(200);
    expect(again.body.data.plan.modulesPerStack).toBe(3);
  });

  it('sales save a plan for a chosen customer account', async () => {
    const sales = await t.signIn('sales');
    const customer = await makeCompany(t.db, { name: 'Banksia Bay Electrical' });
    const saved = await sales.post('/api/stack-plans/saved').send({ name: 'Quote 1042', companyId: customer.id, request: { rangeId: 'TVP-SL48', modules: 4 } }).expect(201);
    expect(saved.body.data.companyName).toBe('Banksia Bay Electrical');
    const bad = await sales.post('/api/stack-plans/saved').send({ name: 'x', request: { rangeId: 'TVP-SL48', modules: 4 } });
    expect(bad.status).toBe(400);
  });
});

describe('authentication on every planner route', () => {
  it('answers 401 without a session', async () => {
    const anon = request(t.app);
    await anon.get('/api/inverters').expect(401);
    await anon.get('/api/ranges/QRB-HEARTH').expect(401);
    await anon.get('/api/stack-plans/saved').expect(401);
    await anon.get('/api/stack-plans/saved/00000000-0000-0000-0000-000000000000/bom.csv').expect(401);
    await anon.get('/api/stack-plans/saved/00000000-0000-0000-0000-000000000000/plan.pdf').expect(401);
    await anon.post('/api/stack-plans/bom.csv').send({ rangeId: 'QRB-HEARTH', modules: 2 }).expect(401);
    await anon.put('/api/ranges/QRB-HEARTH').send({}).expect(401);
  });

  it('lists inverters with their battery windows for any signed-in role', async () => {
    const agent = await t.signIn('installer');
    const res = await agent.get('/api/inverters').expect(200);
    const lv = res.body.data.find((i: { sku: string }) => i.sku === 'QRB-INV-5LV');
    expect(lv.batteryMaxV).toBeGreaterThan(lv.batteryMinV);
  });
});

describe('GET /api/customers', () => {
  it('lists customer accounts for staff and refuses installers', async () => {
    const sales = await t.signIn('sales');
    const c = await makeCompany(t.db, { name: 'Ironbark Solar' });
    const res = await sales.get('/api/customers').expect(200);
    expect(res.body.data.map((x: { id: string }) => x.id)).toContain(c.id);
    const installer = await t.signIn('installer');
    await installer.get('/api/customers').expect(403);
  });
});

describe('range editing', () => {
  const body = async (code: string) => {
    const admin = await t.signIn('purchasing');
    const d = (await admin.get(`/api/ranges/${code}`).expect(200)).body.data;
    return { admin, d, input: { name: d.name, connection: d.connection, controllerSku: d.controllerSku, moduleSku: d.moduleSku, minModules: d.minModules, maxModules: d.maxModules, maxStacks: d.maxStacks, baseHeightMm: d.baseHeightMm, defaultDodPct: d.defaultDodPct, inverterSkus: d.inverterSkus, rules: d.rules } };
  };

  it('gives the client everything to run the planner itself', async () => {
    const { d } = await body('QRB-RIDGE');
    expect(d.planner.range.controller.sku).toBe(d.controllerSku);
    for (const rule of d.rules) expect(d.planner.parts[rule.sku]).toBeTruthy();
  });

  it('refuses a rule naming a missing part, and changes nothing', async () => {
    const { admin, input } = await body('QRB-RIDGE');
    const res = await admin.put('/api/ranges/QRB-RIDGE').send({ ...input, rules: [...input.rules, { sku: 'GHOST-PART', basis: 'per-stack', qty: 1 }] });
    expect(res.status).toBe(400);
    expect(res.body.error.details.fields[0].path).toBe(`rules.${input.rules.length}.sku`);
    const bad = await admin.put('/api/ranges/QRB-RIDGE').send({ ...input, minModules: 5, maxModules: 2 });
    expect(bad.status).toBe(400);
    const [row] = await t.db.select().from(ranges).where(eq(ranges.code, 'QRB-RIDGE'));
    expect((row!.rules as unknown[]).length).toBe(input.rules.length);
  });

  it('moves a part in or out of the range facet when its rules change', async () => {
    const { admin, input } = await body('QRB-RIDGE');
    await t.services.partsIndex.rebuild(t.db);
    const accessory = 'HLM-ACC-LIFT'; // in no demo range's rules
    const facet = async () => (await admin.get('/api/parts').query({ q: accessory })).body.data.find((p: { sku: string }) => p.sku === accessory).ranges;
    expect(await facet()).not.toContain('QRB-RIDGE');
    await admin.put('/api/ranges/QRB-RIDGE').send({ ...input, rules: [...input.rules, { sku: accessory, basis: 'per-system', qty: 1 }] }).expect(200);
    expect(await facet()).toContain('QRB-RIDGE');
    await admin.put('/api/ranges/QRB-RIDGE').send(input).expect(200);
    expect(await facet()).not.toContain('QRB-RIDGE');
  });

  it('saves a changed limit that the planner then enforces', async () => {
    const { admin, input } = await body('QRB-RIDGE');
    await admin.put('/api/ranges/QRB-RIDGE').send({ ...input, maxModules: 4 }).expect(200);
    const res = await admin.post('/api/stack-plans').send({ rangeId: 'QRB-RIDGE', modules: 5 });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/2 to 4/);
  });

  it('is refused to sales and installers', async () => {
    const { input } = await body('QRB-RIDGE');
    for (const role of ['sales', 'installer', 'warehouse'] as const) {
      const agent = await t.signIn(role);
      await agent.put('/api/ranges/QRB-RIDGE').send(input).expect(403);
    }
  });
});
