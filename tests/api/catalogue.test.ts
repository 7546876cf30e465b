import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readdirSync } from 'node:fs';
import request from 'supertest';
import sharp from 'sharp';
import { createTestApp, type TestApp } from '../support/app.ts';
import { seedCatalogue } from '../../seed/catalogue.ts';
import { parts as demoParts } from '../../seed/data/catalogue.ts';
import type { PartInput } from '../../shared/contracts/parts.ts';
import { makeMaker, makePart } from '../../seed/factories.ts';
import { eq } from 'drizzle-orm';
import { partMedia } from '../../server/db/schema/index.ts';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
  await t.db.transaction((tx) => seedCatalogue(tx));
  await t.services.partsIndex.rebuild(t.db);
});
afterAll(() => t.close());

const withKestrelSku = demoParts.find((p) => p.supplierSkus?.some((s) => s.supplier === 'KESTREL') && p.gtin)!;

function newPart(overrides: Partial<PartInput> = {}): PartInput {
  return {
    sku: `TST-${Math.random().toString(36).slice(2, 8).toUpperCase()}`,
    name: 'Test wall bracket, galvanised',
    makerCode: 'HLM',
    packSize: 2,
    massKg: 1.2,
    attributes: { category: 'wall-bracket', fixing: 'masonry' },
    ...overrides,
  } as PartInput;
}

describe('GET /api/parts', () => {
  it('needs a session', async () => {
    await request(t.app).get('/api/parts').expect(401);
  });

  it('lists everything for an empty query, with facet counts that add up', async () => {
    const agent = await t.signIn('sales');
    const res = await agent.get('/api/parts').query({ pageSize: 10 }).expect(200);
    expect(res.body.total).toBe(demoParts.length);
    expect(res.body.data).toHaveLength(10);
    const byCategory = Object.values(res.body.facets.category as Record<string, number>).reduce((a, b) => a + b, 0);
    expect(byCategory).toBe(demoParts.length);
    expect(Object.keys(res.body.facets.maker).sort()).toEqual(['HLM', 'QRB', 'TVP']);
  });

  it('finds by prefix while typing ("cable cov")', async () => {
    const agent = await t.signIn('installer');
    const res = await agent.get('/api/parts').query({ q: 'cable cov' }).expect(200);
    expect(res.body.total).toBeGreaterThan(0);
    expect(res.body.data[0].category).toBe('cable-cover');
  });

  it('tolerates one typo ("controler")', async () => {
    const agent = await t.signIn('sales');
    const res = await agent.get('/api/parts').query({ q: 'controler' }).expect(200);
    expect(res.body.data.some((p: { category: string }) => p.category === 'controller')).toBe(true);
  });

  it('filters by facets; the filtered total matches the facet count', async () => {
    const agent = await t.signIn('sales');
    const all = await agent.get('/api/parts').expect(200);
    const controllers = all.body.facets.category.controller;
    const res = await agent.get('/api/parts').query({ category: 'controller', maker: 'HLM' }).expect(200);
    expect(res.body.data.every((p: { category: string; maker: string }) => p.category === 'controller' && p.maker === 'HLM')).toBe(true);
    expect(res.body.total).toBeLessThanOrEqual(controllers);
    // the chosen facet keeps the counts of its other values, so a user can switch without clearing
    expect(res.body.facets.category.controller).toBe(res.body.total);
    expect(Object.keys(res.body.facets.category).length).toBeGreaterThan(1);
    const stocked = await agent.get('/api/parts').query({ inStock: 'true', pageSize: 200 }).expect(200);
    expect(stocked.body.data.every((p: { available: number }) => p.available > 0)).toBe(true);
    expect(stocked.body.total).toBe(all.body.facets.inStock.true);
  });

  it('sorts by SKU descending', async () => {
    const agent = await t.signIn('sales');
    const res = await agent.get('/api/parts').query({ sort: 'sku', dir: 'desc', pageSize: 5 }).expect(200);
    const skus = res.body.data.map((p: { sku: string }) => p.sku);
    expect(skus).toEqual([...skus].sort().reverse());
  });

  it('sorts by maker as the column shows it: by the maker name, not the code', async () => {
    // Its own small catalogue: a maker whose code sorts first but whose name sorts last.
    const own = await createTestApp();
    try {
      await makePart(own.db, { maker: 'HLM', sku: 'HLM-WB-1' });
      await makePart(own.db, { maker: 'QRB', sku: 'QRB-WB-1' });
      await makePart(own.db, { maker: 'TVP', sku: 'TVP-WB-1' });
      await makeMaker(own.db, { code: 'AAZ', name: 'Zephyr Works' });
      await own.services.partsIndex.rebuild(own.db);
      const purchasing = await own.signIn('purchasing');
      await purchasing.post('/api/parts').send(newPart({ sku: 'AAZ-WB-1', makerCode: 'AAZ' })).expect(201);
      const res = await purchasing.get('/api/parts').query({ sort: 'maker', dir: 'asc', pageSize: 200 }).expect(200);
      const names = res.body.data.map((p: { makerName: string }) => p.makerName);
      // Common practice: a column sorts by what it displays.
      expect(names).toEqual([...names].sort((a, b) => a.localeCompare(b)));
      expect(res.body.data.at(-1).sku).toBe('AAZ-WB-1');
    } finally {
      await own.close();
    }
  });

  it('puts the parts a partial SKU names first', async () => {
    const agent = await t.signIn('sales');
    const res = await agent.get('/api/parts').query({ q: 'HLM-TOR-M' }).expect(200);
    // Common practice: a SKU typed in part finds that SKU family first, not parts that merely
    // mention its words in different fields.
    const top = res.body.data.slice(0, 3).map((p: { sku: string }) => p.sku);
    expect(top.every((sku: string) => sku.startsWith('HLM-TOR-'))).toBe(true);
    expect(top).toContain('HLM-TOR-M5');
  });

  it('jumps to a part whose code has letters only', async () => {
    const purchasing = await t.signIn('purchasing');
    await purchasing.post('/api/parts').send(newPart({ sku: 'LEVELKIT' })).expect(201);
    const res = await purchasing.get('/api/parts').query({ q: 'levelkit' }).expect(200);
    expect(res.body.exactSku).toBe('LEVELKIT');
  });

  it('jumps to the part for an exact SKU, GTIN (also as GTIN-14) or supplier SKU', async () => {
    const agent = await t.signIn('warehouse');
    const p = withKestrelSku;
    for (const code of [p.sku.toLowerCase(), p.gtin!, `0${p.gtin!}`, p.supplierSkus![0]!.sku]) {
      const res = await agent.get('/api/parts').query({ q: code }).expect(200);
      expect(res.body.exactSku).toBe(p.sku);
    }
    const lookup = await agent.get('/api/parts/lookup').query({ code: p.gtin }).expect(200);
    expect(lookup.body.data.sku).toBe(p.sku);
    await agent.get('/api/parts/lookup').query({ code: '0000000000000' }).expect(404);
  });

  it('refuses a bad query with a 400 envelope', async () => {
    const agent = await t.signIn('sales');
    const res = await agent.get('/api/parts').query({ category: 'toaster', pageSize: 5000 });
    expect(res.status).toBe(400);
    expect(res.body.error.details.fields.map((f: { path: string }) => f.path)).toEqual(expect.arrayContaining(['category', 'pageSize']));
  });
});

describe('GET /api/parts/:sku', () => {
  const module = demoParts.find((p) => p.category === 'module' && p.lifecycle === 'active')!;

  it('hides cost, supplier SKUs and on-hand from installers', async () => {
    const agent = await t.signIn('installer');
    const res = await agent.get(`/api/parts/${module.sku}`).expect(200);
    expect(res.body.data.sku).toBe(module.sku);
    expect(res.body.data).not.toHaveProperty('costCents');
    expect(res.body.data).not.toHaveProperty('supplierSkus');
    expect(res.body.data.stock.every((s: object) => !('onHand' in s) && !('reserved' in s))).toBe(true);
    expect(res.body.data.abilities).toEqual({ edit: false, viewCost: false });
    expect(res.body.data.dangerousGoods.unNumber).toBe('UN3480');
  });

  it('hides cost from the warehouse too', async () => {
    const agent = await t.signIn('warehouse');
    const res = await agent.get(`/api/parts/${module.sku}`).expect(200);
    expect(res.body.data).not.toHaveProperty('costCents');
    expect(res.body.data.stock[0]).toHaveProperty('onHand');
  });

  it('shows cost to purchasing, with stock per warehouse', async () => {
    const agent = await t.signIn('purchasing');
    const res = await agent.get(`/api/parts/${module.sku}`).expect(200);
    expect(res.body.data.costCents).toBe(module.costCents);
    expect(res.body.data.stock.map((s: { warehouse: string }) => s.warehouse)).toEqual(['WST', 'NTH']);
    expect(res.body.data.abilities.edit).toBe(true);
  });

  it('keeps a part’s cost when a save leaves cost out, and clears it only on an explicit null', async () => {
    const agent = await t.signIn('purchasing');
    const input = newPart({ sku: 'TST-COST-1', costCents: 4321 });
    await agent.post('/api/parts').send(input).expect(201);
    const { costCents: _left, ...withoutCost } = input;
    await agent.patch('/api/parts/TST-COST-1').send({ ...withoutCost, name: 'Renamed, cost untouched' }).expect(200);
    expect((await agent.get('/api/parts/TST-COST-1').expect(200)).body.data.costCents).toBe(4321);
    await agent.patch('/api/parts/TST-COST-1').send({ ...withoutCost, costCents: null }).expect(200);
    expect((await agent.get('/api/parts/TST-COST-1').expect(200)).body.data.costCents).toBeNull();
  });

  it('refuses a price that is not a number ("sixty") with a field error and keeps the stored price', async () => {
    const agent = await t.signIn('purchasing');
    const input = newPart({ sku: 'TST-PRICE-60', listPriceCents: 6000, costCents: 4000 });
    await agent.post('/api/parts').send(input).expect(201);
    for (const bad of [{ listPriceCents: 'sixty' }, { costCents: 'sixty' }, { listPriceCents: '' }]) {
      const res = await agent.patch('/api/parts/TST-PRICE-60').send({ ...input, ...bad });
      expect(res.status).toBe(400);
      expect(res.body.error.details.fields.map((f: { path: string }) => f.path)).toEqual([Object.keys(bad)[0]]);
    }
    const kept = (await agent.get('/api/parts/TST-PRICE-60').expect(200)).body.data;
    expect([kept.listPriceCents, kept.costCents]).toEqual([6000, 4000]);
  });

  it('links superseded parts both ways', async () => {
    const old = demoParts.find((p) => p.lifecycle === 'superseded')!;
    const agent = await t.signIn('sales');
    const res = await agent.get(`/api/parts/${old.sku}`).expect(200);
    expect(res.body.data.supersededBy.sku).toBe(old.supersededBy);
    const successor = await agent.get(`/api/parts/${old.supersededBy}`).expect(200);
    expect(successor.body.data.supersedes.map((s: { sku: string }) => s.sku)).toContain(old.sku);
  });

  it('answers 404 for an unknown SKU', async () => {
    const agent = await t.signIn('sales');
    const res = await agent.get('/api/parts/NOPE-123').expect(404);
    expect(res.body.error.code).toBe('not_found');
  });
});

describe('writing parts', () => {
  it.each(['installer', 'warehouse', 'sales'] as const)('is refused to %s with 403', async (role) => {
    const agent = await t.signIn(role);
    await agent.post('/api/parts').send(newPart()).expect(403);
    await agent.patch(`/api/parts/${demoParts[0]!.sku}`).send(newPart({ sku: demoParts[0]!.sku })).expect(403);
    await agent.post(`/api/parts/${demoParts[0]!.sku}/archive`).expect(403);
  });

  it('creates a part that search finds at once', async () => {
    const agent = await t.signIn('purchasing');
    const input = newPart({ name: 'Zirconwood masonry bracket' });
    const res = await agent.post('/api/parts').send(input).expect(201);
    expect(res.body.data).toMatchObject({ sku: input.sku, category: 'wall-bracket', maker: 'HLM' });
    const found = await agent.get('/api/parts').query({ q: 'zirconwood' }).expect(200);
    expect(found.body.data.map((p: { sku: string }) => p.sku)).toEqual([input.sku]);
  });

  it('refuses bad input field by field and changes nothing', async () => {
    const agent = await t.signIn('purchasing');
    const before = (await agent.get('/api/parts')).body.total;
    const badGtin = await agent.post('/api/parts').send(newPart({ gtin: '6291041500214' })); // GS1 example 629104150021 has check digit 3, not 4
    expect(badGtin.status).toBe(400);
    expect(badGtin.body.error.details.fields.map((f: { path: string }) => f.path)).toContain('gtin');

    const wrongAttrs = await agent.post('/api/parts').send(newPart({ attributes: { category: 'wall-bracket', nominalV: 51.2 } as never }));
    expect(wrongAttrs.status).toBe(400);
    expect(wrongAttrs.body.error.details.fields[0].path).toMatch(/^attributes/);

    const absurd = await agent.post('/api/parts').send(newPart({ massKg: -3, packSize: 0 }));
    expect(absurd.status).toBe(400);
    expect(absurd.body.error.details.fields.map((f: { path: string }) => f.path)).toEqual(expect.arrayContaining(['massKg', 'packSize']));

    const unknownMaker = await agent.post('/api/parts').send(newPart({ makerCode: 'ZZZ' }));
    expect(unknownMaker.status).toBe(400);
    expect(unknownMaker.body.error.details.fields[0].path).toBe('makerCode');

    const cells = await agent.post('/api/parts').send(newPart({ attributes: { category: 'module', nominalV: 51.2, ratedAh: 100, chemistry: 'LFP' } as never }));
    expect(cells.status).toBe(400);
    expect(cells.body.error.details.fields.map((f: { path: string }) => f.path)).toContain('dangerousGoods');

    expect((await agent.get('/api/parts')).body.total).toBe(before);
  });

  it('refuses a duplicate SKU or GTIN with 409 naming the field', async () => {
    const agent = await t.signIn('purchasing');
    const taken = demoParts.find((p) => p.gtin)!;
    const dupSku = await agent.post('/api/parts').send(newPart({ sku: taken.sku }));
    expect(dupSku.status).toBe(409);
    expect(dupSku.body.error.details.fields[0].path).toBe('sku');
    const dupGtin = await agent.post('/api/parts').send(newPart({ gtin: taken.gtin }));
    expect(dupGtin.status).toBe(409);
    expect(dupGtin.body.error.details.fields[0].path).toBe('gtin');
  });

  it('updates, archives (hidden from search) and restores', async () => {
    const agent = await t.signIn('admin');
    const input = newPart();
    await agent.post('/api/parts').send(input).expect(201);
    const renamed = await agent.patch(`/api/parts/${input.sku}`).send({ ...input, name: 'Quokkaline stud bracket' }).expect(200);
    expect(renamed.body.data.name).toBe('Quokkaline stud bracket');
    expect((await agent.get('/api/parts').query({ q: 'quokkaline' })).body.total).toBe(1);
    const archived = await agent.post(`/api/parts/${input.sku}/archive`).expect(200);
    expect(archived.body.data.archived).toBe(true);
    expect((await agent.get('/api/parts').query({ q: 'quokkaline' })).body.total).toBe(0);
    await agent.post(`/api/parts/${input.sku}/restore`).expect(200);
    expect((await agent.get('/api/parts').query({ q: 'quokkaline' })).body.total).toBe(1);
  });
});

describe('media uploads', () => {
  const sku = demoParts.find((p) => p.category === 'feet')!.sku;
  const png = () => sharp({ create: { width: 640, height: 400, channels: 3, background: '#a8482a' } }).png().toBuffer();
  const stored = () => readdirSync(t.filesDir, { recursive: true }).filter((f) => String(f).includes('.')).length;

  it('stores a photo with a thumbnail, decided by content', async () => {
    const agent = await t.signIn('purchasing');
    const res = await agent.post(`/api/parts/${sku}/media`).attach('file', await png(), { filename: 'photo.bin', contentType: 'application/octet-stream' }).expect(201);
    expect(res.body.data).toMatchObject({ kind: 'image', contentType: 'image/png', fileName: 'photo.png' });
    const thumb = await agent.get(res.body.data.thumbnailUrl).expect(200);
    expect(thumb.headers['content-type']).toBe('image/webp');
    // Stored files never change under their id: cached privately for a year (RFC 9111
    // immutable), never sniffed, shown inline under their cleaned name.
    const original = await agent.get(res.body.data.url).expect(200);
    for (const served of [thumb, original]) {
      expect(served.headers['cache-control']).toBe('private, max-age=31536000, immutable');
      expect(served.headers['x-content-type-options']).toBe('nosniff');
    }
    expect(original.headers['content-type']).toBe('image/png');
    expect(original.headers['content-disposition']).toBe('inline; filename="photo.png"');
    const meta = await sharp(thumb.body).metadata();
    expect(Math.max(meta.width!, meta.height!)).toBe(320);
    const list = await agent.get('/api/parts').query({ q: sku }).expect(200);
    expect(list.body.data.find((p: { sku: string }) => p.sku === sku).thumbnailUrl).toBe(res.body.data.thumbnailUrl);
  });

  it('stores a PDF datasheet', async () => {
    const agent = await t.signIn('purchasing');
    const pdf = Buffer.from('%PDF-1.4\n1 0 obj<<>>endobj\ntrailer<<>>\n%%EOF\n');
    const res = await agent.post(`/api/parts/${sku}/media`).attach('file', pdf, 'datasheet.pdf').expect(201);
    expect(res.body.data.kind).toBe('datasheet');
    const file = await agent.get(res.body.data.url).expect(200);
    expect(file.headers['content-type']).toBe('application/pdf');
  });

  it('refuses a wrong type (by content, whatever the name), an empty file and an oversized photo; stores nothing', async () => {
    const agent = await t.signIn('purchasing');
    const before = stored();
    const fake = await agent.post(`/api/parts/${sku}/media`).attach('file', Buffer.from('just text, honestly'), 'photo.png');
    expect(fake.status).toBe(415);
    expect(fake.body.error.code).toBe('unsupported_file_type');
    const empty = await agent.post(`/api/parts/${sku}/media`).attach('file', Buffer.alloc(0), 'empty.png');
    expect(empty.status).toBe(400);
    const none = await agent.post(`/api/parts/${sku}/media`).field('note', 'no file');
    expect(none.status).toBe(400);
    const big = await sharp({ create: { width: 1800, height: 1800, channels: 4, background: '#123456' } }).png({ compressionLevel: 0 }).toBuffer();
    expect(big.length).toBeGreaterThan(5 * 1024 * 1024);
    const tooBig = await agent.post(`/api/parts/${sku}/media`).attach('file', big, 'big.png');
    expect(tooBig.status).toBe(413);
    expect(stored()).toBe(before);
  });

  it('is refused to installers', async () => {
    const agent = await t.signIn('installer');
    await agent.post(`/api/parts/${sku}/media`).attach('file', await png(), 'p.png').expect(403);
  });
});

describe('media routes', () => {
  it('answer 401 without a session and 404 for unknown files', async () => {
    const anon = request(t.app);
    await anon.get('/api/media/00000000-0000-0000-0000-000000000000').expect(401);
    await anon.delete(`/api/parts/${demoParts[0]!.sku}/media/00000000-0000-0000-0000-000000000000`).expect(401);
    await anon.post(`/api/parts/${demoParts[0]!.sku}/media`).attach('file', Buffer.from('x'), 'x.png').expect(401);
    const agent = await t.signIn('purchasing');
    await agent.get('/api/media/00000000-0000-0000-0000-000000000000').expect(404);
    await agent.get('/api/media/not-a-uuid').expect(400);
    await agent.delete(`/api/parts/${demoParts[0]!.sku}/media/00000000-0000-0000-0000-000000000000`).expect(404);
  });

  it('let purchasing remove a photo, and refuse that to sales', async () => {
    const agent = await t.signIn('purchasing');
    const sku = demoParts.find((p) => p.category === 'end-cap')!.sku;
    const png = await sharp({ create: { width: 40, height: 40, channels: 3, background: '#0e6b63' } }).png().toBuffer();
    const up = await agent.post(`/api/parts/${sku.toLowerCase()}/media`).attach('file', png, 'cap.png').expect(201);
    const sales = await t.signIn('sales');
    await sales.delete(`/api/parts/${sku}/media/${up.body.data.id}`).expect(403);
    await agent.delete(`/api/parts/${sku}/media/${up.body.data.id}`).expect(204);
    await agent.get(up.body.data.url).expect(404);
  });

  it('refuse a datasheet over 20 MB', async () => {
    const agent = await t.signIn('purchasing');
    const big = Buffer.concat([Buffer.from('%PDF-1.4\n'), Buffer.alloc(21 * 1024 * 1024, 32)]);
    const res = await agent.post(`/api/parts/${demoParts[0]!.sku}/media`).attach('file', big, 'huge.pdf');
    expect(res.status).toBe(413);
  });
});

describe('identity rules', () => {
  it('refuses the same item as GTIN-14 on a second part (unique as GTIN-14)', async () => {
    const agent = await t.signIn('purchasing');
    const taken = demoParts.find((p) => p.gtin)!;
    const res = await agent.post('/api/parts').send(newPart({ gtin: `0${taken.gtin}` }));
    expect(res.status).toBe(409);
    expect(res.body.error.details.fields[0].path).toBe('gtin');
  });

  it('refuses to rename a SKU that range rules use', async () => {
    const agent = await t.signIn('purchasing');
    const feet = (await agent.get('/api/parts/HLM-TOR-FEET').expect(200)).body.data;
    const input = { sku: 'HLM-TOR-FEET-2', name: feet.name, makerCode: 'HLM', packSize: feet.packSize, massKg: feet.massKg, attributes: feet.attributes };
    const res = await agent.patch('/api/parts/HLM-TOR-FEET').send(input);
    expect(res.status).toBe(409);
    expect(res.body.error.details.fields[0].path).toBe('sku');
  });

  it('does not reveal supplier SKUs to installers: no scan jump, no search hit, no CSV row', async () => {
    const code = withKestrelSku.supplierSkus![0]!.sku;
    const installer = await t.signIn('installer');
    const res = await installer.get('/api/parts').query({ q: code }).expect(200);
    expect(res.body.exactSku).toBeNull();
    expect(res.body.data.map((p: { sku: string }) => p.sku)).not.toContain(withKestrelSku.sku);
    const csv = await installer.get('/api/parts/export.csv').query({ q: code }).expect(200);
    expect(csv.text).not.toContain(withKestrelSku.sku);

    // Staff who may see supplier data find the part by the same code, at the top.
    const sales = await t.signIn('sales');
    const found = await sales.get('/api/parts').query({ q: code }).expect(200);
    expect(found.body.data[0].sku).toBe(withKestrelSku.sku);
  });

  it('sends no cost in list results or CSV exports to installers or the warehouse', async () => {
    for (const role of ['installer', 'warehouse'] as const) {
      const agent = await t.signIn(role);
      const list = await agent.get('/api/parts').query({ pageSize: 100 }).expect(200);
      expect(list.body.data.length).toBeGreaterThan(0);
      expect(JSON.stringify(list.body)).not.toMatch(/cost/i);
      const csv = await agent.get('/api/parts/export.csv').expect(200);
      expect(csv.text.split('\n')[0]).not.toMatch(/cost/i);
    }
  });
});

describe('start-up index check', () => {
  it('rebuilds an empty index from the database and leaves a full one alone', async () => {
    const fresh = await createTestApp();
    try {
      for (let i = 0; i < 7; i++) await makePart(fresh.db);
      const index = fresh.services.partsIndex;
      // The engine restarted empty (the stand-in keeps its index in memory): every part comes back.
      await index.index.deleteAllDocuments().waitTask();
      expect(await index.ensure(fresh.db)).toEqual({ rebuilt: true, documents: 7 });
      expect((await index.index.getStats()).numberOfDocuments).toBe(7);
      // A second start finds it full and sends nothing.
      expect(await index.ensure(fresh.db)).toEqual({ rebuilt: false, documents: 7 });
      const sales = await fresh.signIn('sales');
      expect((await sales.get('/api/parts').expect(200)).body.total).toBe(7);
    } finally {
      await fresh.close();
    }
  });
});

describe('when search is down', () => {
  it('answers 503 with a clear message, and health says so', async () => {
    const down = await createTestApp();
    try {
      const agent = await down.signIn('sales');
      await down.stopSearch();
      const res = await agent.get('/api/parts').query({ q: 'cable' });
      expect(res.status).toBe(503);
      expect(res.body.error.code).toBe('search_unavailable');
      const health = await request(down.app).get('/api/health').expect(200);
      expect(health.body).toMatchObject({ status: 'degraded', db: 'up', search: 'down' });
      // A photo and its search document change together: with the index unreachable, no photo is kept.
      const part = await makePart(down.db);
      const purchasing = await down.signIn('purchasing');
      const upload = await purchasing.post(`/api/parts/${part.sku}/media`).attach('file', await sharp({ create: { width: 64, height: 40, channels: 3, background: '#a8482a' } }).png().toBuffer(), 'p.png');
      expect(upload.status).toBe(503);
      expect(await down.db.select().from(partMedia).where(eq(partMedia.partId, part.id))).toEqual([]);
    } finally {
      await down.close();
    }
  });
});

describe('when the search server answers with an error', () => {
  it('is an internal error with a request id, not "search unavailable", and leaks nothing', async () => {
    const broken = await createTestApp();
    try {
      const agent = await broken.signIn('sales');
      // The engine is up but has lost the index: it answers 404 index_not_found (Meilisearch errors reference).
      await broken.services.partsIndex.index.delete();
      const res = await agent.get('/api/parts').query({ q: 'cable' });
      expect(res.status).toBe(500);
      expect(res.body.error.code).toBe('internal');
      expect(res.body.requestId).toEqual(expect.any(String));
      expect(res.text).not.toMatch(/index_not_found|at .*\.ts/);
    } finally {
      await broken.close();
    }
  });
});

describe('CSV export', () => {
  it('neutralises formula injection in text cells and leaves numbers alone', async () => {
    const agent = await t.signIn('purchasing');
    const input = newPart({ name: '=HYPERLINK("http://x.example","click")' });
    await agent.post('/api/parts').send(input).expect(201);
    const res = await agent.get('/api/parts/export.csv').query({ q: input.sku }).expect(200);
    expect(res.headers['content-type']).toMatch(/text\/csv/);
    // OWASP CSV injection guidance: a leading apostrophe stops the formula
    expect(res.text).toContain(`"'=HYPERLINK(""http://x.example"",""click"")"`);
    expect(res.text).toMatch(new RegExp(`${input.sku},.*,2,0,`));
  });

  it('writes list prices as exact decimal dollars', async () => {
    const agent = await t.signIn('purchasing');
    const cases: [number, string][] = [[1999, '19.99'], [10, '0.10'], [23456789, '234567.89'], [0, '0.00']];
    for (const [cents] of cases) await agent.post('/api/parts').send(newPart({ sku: `TST-CSV-${cents}`, listPriceCents: cents })).expect(201);
    const res = await agent.get('/api/parts/export.csv').query({ q: 'TST-CSV', pageSize: 50 }).expect(200);
    // Common practice: a CSV money column is a plain decimal with two places, no symbol or grouping.
    for (const [cents, dollars] of cases) expect(res.text).toMatch(new RegExp(`TST-CSV-${cents},.*,${dollars.replace('.', '\\.')}\\r?$`, 'm'));
  });
});

describe('makers and ranges', () => {
  it('lists makers with counts and ranges with their units', async () => {
    const agent = await t.signIn('installer');
    const makers = await agent.get('/api/makers').expect(200);
    expect(makers.body.data.map((m: { code: string }) => m.code).sort()).toEqual(['HLM', 'QRB', 'TVP']);
    const ranges = await agent.get('/api/ranges').expect(200);
    expect(ranges.body.data.length).toBeGreaterThanOrEqual(3);
    expect(ranges.body.data[0]).toHaveProperty('controllerSku');
    expect(['series', 'parallel']).toContain(ranges.body.data[0].connection);
  });
});
