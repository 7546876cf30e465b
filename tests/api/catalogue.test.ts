import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readdirSync } from 'node:fs';
import request from 'supertest';
import sharp from 'sharp';
import { createTestApp, type TestApp } from '../support/app.ts';
import type { PartInput } from '../../shared/contracts/parts.ts';
import { makeGtin, makeMaker, makePart, makeRange, makeWarehouse, receiveStock } from '../../seed/factories.ts';
import { eq } from 'drizzle-orm';
import type { DbOrTx, Tx } from '../../server/db/client.ts';
import { partMedia } from '../../server/db/schema/index.ts';

// Each describe block builds the parts it needs with the seed's own factories; the catalogue
// starts empty, so a count is the count of what the block built.
let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
  await makeMaker(t.db, { code: 'HLM', name: 'Hollowmere Energy' }); // the maker newPart() names
});
afterAll(() => t.close());

/** Builds in one transaction, then sends every part to search through the app's own sync. */
async function build<T>(make: (tx: Tx) => Promise<T>, app: TestApp = t): Promise<T> {
  const made = await app.db.transaction(make);
  await app.services.partsIndex.sync(app.db);
  return made;
}

/** The two depots: Western comes first by rank, though its code sorts after Northern's. */
async function depots(db: DbOrTx) {
  return [await makeWarehouse(db, { code: 'WST', name: 'Western depot', rank: 1 }), await makeWarehouse(db, { code: 'NTH', name: 'Northern depot', rank: 2 })] as const;
}

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
  // A small catalogue from three makers: a SKU family (HLM-TOR-*) and parts that hold the same
  // words spread over other fields (HLM-ACC-FIX-M, HLM-ACC-CAB, the inverter), controllers from
  // two makers, a cable set beside a cable cover, and a part with a GTIN and a supplier's SKU;
  // some stocked, some not.
  let built: { sku: string }[];
  let stockedSkus: string[];
  let coded: { sku: string; gtin: string; supplierSku: string };
  beforeAll(async () => {
    coded = { sku: 'QRB-HRT-EC', gtin: makeGtin(), supplierSku: 'KT-520077' };
    ({ built, stockedSkus } = await build(async (tx) => {
      const specs = [
        { sku: 'HLM-TOR-CTL', name: 'Tor HV controller', category: 'controller' as const },
        { sku: 'HLM-TOR-M5', name: 'Tor HV battery module 5.1 kWh', category: 'module' as const },
        { sku: 'HLM-TOR-M46', name: 'Tor HV battery module 4.6 kWh (first generation)', category: 'module' as const },
        { sku: 'HLM-TOR-FEET', name: 'Tor adjustable feet, pack of 4', category: 'feet' as const },
        { sku: 'HLM-TOR-WB-M', name: 'Tor wall bracket, masonry', category: 'wall-bracket' as const },
        { sku: 'HLM-ACC-FIX-M', name: 'Masonry fixing kit for Tor brackets', category: 'accessory' as const, description: 'Four M8 sleeve anchors for one bracket on brick or block.' },
        { sku: 'HLM-ACC-CAB', name: 'Tor outdoor battery cabinet', category: 'accessory' as const, description: 'Vented steel cabinet housing one Tor stack of up to 6 modules.' },
        { sku: 'HLM-CCV-15', name: 'Battery cable protection cover, 1.5 m', category: 'cable-cover' as const },
        { sku: 'HLM-CBL-015', name: 'Battery cable set 35 mm², 1.5 m', category: 'cable-set' as const },
        { sku: 'QRB-HRT-CTL', name: 'Hearth controller', category: 'controller' as const, maker: 'QRB' },
        { sku: coded.sku, name: 'Hearth end cap', category: 'end-cap' as const, maker: 'QRB', gtin: coded.gtin, supplierSkus: [{ supplier: 'KESTREL', sku: coded.supplierSku }] },
        { sku: 'TVP-INV-15HV3', name: 'Tarrow hybrid inverter 15 kW', category: 'inverter' as const, maker: 'TVP', description: 'Takes Tor HV stacks of up to 8 modules.' },
      ];
      const rows = [];
      for (const spec of specs) rows.push(await makePart(tx, spec));
      const [wst, nth] = await depots(tx);
      const stocked = rows.filter((r) => ['HLM-TOR-CTL', 'HLM-TOR-M5', 'HLM-TOR-FEET', 'HLM-CCV-15'].includes(r.sku));
      await receiveStock(tx, stocked.flatMap((r, i) => [{ partId: r.id, warehouseId: wst.id, bin: `A-0${i + 1}-1`, onHand: 4 + i }, { partId: r.id, warehouseId: nth.id, bin: `B-0${i + 1}-1`, onHand: 2 }]));
      return { built: rows, stockedSkus: stocked.map((r) => r.sku) };
    }));
  });

  it('needs a session', async () => {
    await request(t.app).get('/api/parts').expect(401);
  });

  it('lists everything for an empty query, with facet counts that add up', async () => {
    const agent = await t.signIn('sales');
    const res = await agent.get('/api/parts').query({ pageSize: 10 }).expect(200);
    expect(res.body.total).toBe(built.length);
    expect(res.body.data).toHaveLength(10);
    const byCategory = Object.values(res.body.facets.category as Record<string, number>).reduce((a, b) => a + b, 0);
    expect(byCategory).toBe(built.length);
    expect(Object.keys(res.body.facets.maker).sort()).toEqual(['HLM', 'QRB', 'TVP']);
  });

  it('finds by prefix while typing ("cable cov")', async () => {
    const agent = await t.signIn('installer');
    const res = await agent.get('/api/parts').query({ q: 'cable cov' }).expect(200);
    expect(res.body.total).toBeGreaterThan(0);
    expect(res.body.data[0].category).toBe('cable-cover');
    expect(res.body.data[0].sku).toBe('HLM-CCV-15');
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
    expect(controllers).toBe(2); // HLM-TOR-CTL and QRB-HRT-CTL
    const res = await agent.get('/api/parts').query({ category: 'controller', maker: 'HLM' }).expect(200);
    expect(res.body.data.every((p: { category: string; maker: string }) => p.category === 'controller' && p.maker === 'HLM')).toBe(true);
    expect(res.body.total).toBeLessThanOrEqual(controllers);
    expect(res.body.data.map((p: { sku: string }) => p.sku)).toEqual(['HLM-TOR-CTL']);
    // the chosen facet keeps the counts of its other values, so a user can switch without clearing
    expect(res.body.facets.category.controller).toBe(res.body.total);
    expect(Object.keys(res.body.facets.category).length).toBeGreaterThan(1);
    const stocked = await agent.get('/api/parts').query({ inStock: 'true', pageSize: 200 }).expect(200);
    expect(stocked.body.data.every((p: { available: number }) => p.available > 0)).toBe(true);
    expect(stocked.body.total).toBe(all.body.facets.inStock.true);
    expect(stocked.body.data.map((p: { sku: string }) => p.sku).sort()).toEqual([...stockedSkus].sort());
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
    // the parts holding those words in other fields are found, below the family
    expect(res.body.data.map((p: { sku: string }) => p.sku)).toContain('HLM-ACC-FIX-M');
  });

  it('jumps to a part whose code has letters only', async () => {
    const purchasing = await t.signIn('purchasing');
    await purchasing.post('/api/parts').send(newPart({ sku: 'LEVELKIT' })).expect(201);
    const res = await purchasing.get('/api/parts').query({ q: 'levelkit' }).expect(200);
    expect(res.body.exactSku).toBe('LEVELKIT');
  });

  it('jumps to the part for an exact SKU, GTIN (also as GTIN-14) or supplier SKU', async () => {
    const agent = await t.signIn('warehouse');
    const p = coded;
    for (const code of [p.sku.toLowerCase(), p.gtin, `0${p.gtin}`, p.supplierSku]) {
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
  // A battery module (cells: dangerous goods) stocked in both depots, and a superseded part.
  let module: { sku: string; costCents: number | null };
  let old: { sku: string; supersededBy: string };
  beforeAll(async () => {
    ({ module, old } = await build(async (tx) => {
      const made = await makePart(tx, { category: 'module', name: 'Kettlewick battery module 5.1 kWh', costCents: 187_550 });
      const [wst, nth] = await depots(tx);
      await receiveStock(tx, [
        { partId: made.id, warehouseId: nth.id, bin: 'N-01-1', onHand: 3 },
        { partId: made.id, warehouseId: wst.id, bin: 'W-01-1', onHand: 7 },
      ]);
      const successor = await makePart(tx, { name: 'Kettlewick feet, second generation', category: 'feet' });
      const older = await makePart(tx, { name: 'Kettlewick feet, first generation', category: 'feet', lifecycle: 'superseded', supersededBy: successor.sku });
      return { module: made, old: { sku: older.sku, supersededBy: successor.sku } };
    }));
  });

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
    expect(res.body.data.stock.map((s: { onHand: number }) => s.onHand)).toEqual([7, 3]);
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
    const input = newPart({ sku: 'TST-KEPT-1', costCents: 4321 });
    await agent.post('/api/parts').send(input).expect(201);
    const { costCents: _left, ...withoutCost } = input;
    await agent.patch('/api/parts/TST-KEPT-1').send({ ...withoutCost, name: 'Renamed, cost untouched' }).expect(200);
    expect((await agent.get('/api/parts/TST-KEPT-1').expect(200)).body.data.costCents).toBe(4321);
    await agent.patch('/api/parts/TST-KEPT-1').send({ ...withoutCost, costCents: null }).expect(200);
    expect((await agent.get('/api/parts/TST-KEPT-1').expect(200)).body.data.costCents).toBeNull();
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
  // One part that has a GTIN, for the refusals that name an existing part.
  let taken: { sku: string; gtin: string | null };
  beforeAll(async () => {
    taken = await build((tx) => makePart(tx, { name: 'Kettlewick stud bracket', gtin: makeGtin() }));
  });

  it.each(['installer', 'warehouse', 'sales'] as const)('is refused to %s with 403', async (role) => {
    const agent = await t.signIn(role);
    await agent.post('/api/parts').send(newPart()).expect(403);
    await agent.patch(`/api/parts/${taken.sku}`).send(newPart({ sku: taken.sku })).expect(403);
    await agent.post(`/api/parts/${taken.sku}/archive`).expect(403);
    const kept = (await agent.get(`/api/parts/${taken.sku}`).expect(200)).body.data;
    expect([kept.name, kept.archived]).toEqual(['Kettlewick stud bracket', false]);
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
    const dupSku = await agent.post('/api/parts').send(newPart({ sku: taken.sku }));
    expect(dupSku.status).toBe(409);
    expect(dupSku.body.error.details.fields[0].path).toBe('sku');
    const dupGtin = await agent.post('/api/parts').send(newPart({ gtin: taken.gtin! }));
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
  let sku: string;
  beforeAll(async () => {
    ({ sku } = await build((tx) => makePart(tx, { name: 'Kettlewick adjustable feet, pack of 4', category: 'feet' })));
  });
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
  let bracket: string;
  let endCap: string;
  beforeAll(async () => {
    [bracket, endCap] = await build(async (tx) => [(await makePart(tx)).sku, (await makePart(tx, { name: 'Kettlewick end cap', category: 'end-cap' })).sku]);
  });

  it('answer 401 without a session and 404 for unknown files', async () => {
    const anon = request(t.app);
    await anon.get('/api/media/00000000-0000-0000-0000-000000000000').expect(401);
    await anon.delete(`/api/parts/${bracket}/media/00000000-0000-0000-0000-000000000000`).expect(401);
    await anon.post(`/api/parts/${bracket}/media`).attach('file', Buffer.from('x'), 'x.png').expect(401);
    const agent = await t.signIn('purchasing');
    await agent.get('/api/media/00000000-0000-0000-0000-000000000000').expect(404);
    await agent.get('/api/media/not-a-uuid').expect(400);
    await agent.delete(`/api/parts/${bracket}/media/00000000-0000-0000-0000-000000000000`).expect(404);
  });

  it('let purchasing remove a photo, and refuse that to sales', async () => {
    const agent = await t.signIn('purchasing');
    const sku = endCap;
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
    const res = await agent.post(`/api/parts/${bracket}/media`).attach('file', big, 'huge.pdf');
    expect(res.status).toBe(413);
  });
});

describe('identity rules', () => {
  // A part with a GTIN and a supplier's SKU, and feet that a range's BOM rules name.
  let taken: { sku: string; gtin: string; supplierSku: string };
  let feetSku: string;
  beforeAll(async () => {
    taken = { sku: 'QRB-HRT-WB', gtin: makeGtin(), supplierSku: 'KT-520155' };
    feetSku = await build(async (tx) => {
      await makePart(tx, { sku: taken.sku, name: 'Hearth wall bracket', maker: 'QRB', gtin: taken.gtin, supplierSkus: [{ supplier: 'KESTREL', sku: taken.supplierSku }] });
      const feet = await makePart(tx, { name: 'Kettlewick stack feet, pack of 4', category: 'feet', packSize: 4, unit: 'pack' });
      await makeRange(tx, { name: 'Kettlewick Stack', rules: [{ sku: feet.sku, basis: 'per-stack', qty: 4 }] });
      return feet.sku;
    });
  });

  it('refuses the same item as GTIN-14 on a second part (unique as GTIN-14)', async () => {
    const agent = await t.signIn('purchasing');
    const res = await agent.post('/api/parts').send(newPart({ gtin: `0${taken.gtin}` }));
    expect(res.status).toBe(409);
    expect(res.body.error.details.fields[0].path).toBe('gtin');
  });

  it('refuses to rename a SKU that range rules use', async () => {
    const agent = await t.signIn('purchasing');
    const feet = (await agent.get(`/api/parts/${feetSku}`).expect(200)).body.data;
    const input = { sku: `${feetSku}-2`, name: feet.name, makerCode: 'HLM', packSize: feet.packSize, massKg: feet.massKg, attributes: feet.attributes };
    const res = await agent.patch(`/api/parts/${feetSku}`).send(input);
    expect(res.status).toBe(409);
    expect(res.body.error.details.fields[0].path).toBe('sku');
    await agent.get(`/api/parts/${feetSku}`).expect(200);
  });

  it('does not reveal supplier SKUs to installers: no scan jump, no search hit, no CSV row', async () => {
    const code = taken.supplierSku;
    const installer = await t.signIn('installer');
    const res = await installer.get('/api/parts').query({ q: code }).expect(200);
    expect(res.body.exactSku).toBeNull();
    expect(res.body.data.map((p: { sku: string }) => p.sku)).not.toContain(taken.sku);
    const csv = await installer.get('/api/parts/export.csv').query({ q: code }).expect(200);
    expect(csv.text).not.toContain(taken.sku);

    // Staff who may see supplier data find the part by the same code, at the top.
    const sales = await t.signIn('sales');
    const found = await sales.get('/api/parts').query({ q: code }).expect(200);
    expect(found.body.data[0].sku).toBe(taken.sku);
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
    // Its own catalogue, so the lists hold exactly what is built here: three makers whose names
    // sort in another order than their codes, a range each (controller and module), and feet.
    const own = await createTestApp();
    try {
      const built = await build(async (tx) => {
        await makeMaker(tx, { code: 'HLM', name: 'Wattlebank Cells' });
        await makeMaker(tx, { code: 'QRB', name: 'Brindle Power' });
        await makeMaker(tx, { code: 'TVP', name: 'Mallee Energy' });
        const range = async (maker: string, name: string, connection: 'series' | 'parallel') => {
          const [controller, module] = [await makePart(tx, { maker, category: 'controller' }), await makePart(tx, { maker, category: 'module' })];
          await makeRange(tx, { maker, name, connection, controllerSku: controller.sku, moduleSku: module.sku });
          return [name, connection, controller.sku, module.sku];
        };
        const ranges = [await range('HLM', 'Wattlebank Tall', 'series'), await range('QRB', 'Brindle Hearth', 'parallel'), await range('TVP', 'Mallee Stackline', 'parallel')];
        await makePart(tx, { maker: 'HLM', category: 'feet' });
        return ranges;
      }, own);
      const agent = await own.signIn('installer');
      const makers = await agent.get('/api/makers').expect(200);
      expect(makers.body.data.map((m: { code: string }) => m.code).sort()).toEqual(['HLM', 'QRB', 'TVP']);
      // by name, each with its parts: a range's controller and module, and the feet
      expect(makers.body.data.map((m: { code: string; parts: number }) => [m.code, m.parts])).toEqual([['QRB', 2], ['TVP', 2], ['HLM', 3]]);
      const ranges = await agent.get('/api/ranges').expect(200);
      expect(ranges.body.data.length).toBe(built.length);
      expect(ranges.body.data[0]).toHaveProperty('controllerSku');
      expect(['series', 'parallel']).toContain(ranges.body.data[0].connection);
      // by name, each with its own controller and module
      type Range = { name: string; connection: string; controllerSku: string; moduleSku: string };
      expect(ranges.body.data.map((r: Range) => [r.name, r.connection, r.controllerSku, r.moduleSku])).toEqual([built[1], built[2], built[0]]);
    } finally {
      await own.close();
    }
  });
});
